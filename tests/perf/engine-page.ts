import type { CaseSpec } from './engine-cases';
import type { EngineFigures } from './engine-targets';
import type { BenchCase } from './run';
export async function enginePageCases(_specs: CaseSpec[]): Promise<{ figures: EngineFigures[]; summary: BenchCase }> {
  return { figures: [], summary: { case: 'engine chromium', skipped: 'not yet' } };
}
