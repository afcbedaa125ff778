/**
 * The properties a lab grades with (`prove` steps of its visible self-check script), for the
 * Proof tab's read-only "This lab's properties". A step's own label names the property when the
 * property has none; a step whose property does not parse is left out (the self-check reports it).
 */
import type { CheckScript } from '@shared/checks';
import { PropertySchema, type Property } from '@shared/proof';

export function labProperties(script: CheckScript | null | undefined): Property[] {
  if (!script) return [];
  const found: Property[] = [];
  for (const step of script.steps) {
    if (!('prove' in step)) continue;
    const parsed = PropertySchema.safeParse(step.prove);
    if (!parsed.success) continue;
    const label = parsed.data.label ?? ('label' in step && typeof step.label === 'string' ? step.label : undefined);
    found.push(label !== undefined ? { ...parsed.data, label } : parsed.data);
  }
  return found;
}
