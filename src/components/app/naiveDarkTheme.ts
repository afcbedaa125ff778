// naive-ui's dark theme alone, so it can be a chunk of its own (see `darkTheme.ts`).
export { darkTheme } from 'naive-ui';
