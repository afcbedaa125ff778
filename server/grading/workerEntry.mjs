// The grading worker's entry in plain JavaScript: a worker thread does not inherit the parent's
// TypeScript loader, so this file loads the TypeScript worker through tsx's API.
import { tsImport } from 'tsx/esm/api';

await tsImport('./worker.ts', import.meta.url);
