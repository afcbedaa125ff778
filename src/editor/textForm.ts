/**
 * The one-line text form of each rung shown under it on the canvas (docs/names-and-rules.md: "every rung also
 * has a one-line text form, e.g. `S1 AND (S2 OR K1) -> K1`"), from `shared/ladder/text.ts`.
 */
import type { Program } from '@shared/ladder/schema';
import { rungText } from '@shared/ladder/text';

/** Rung id → its text form, for every rung. */
export function rungTextMap(program: Program): Map<string, string> {
  return new Map(program.rungs.map((rung) => [rung.id, rungText(rung, program)]));
}
