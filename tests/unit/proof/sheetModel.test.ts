import { describe, expect, it } from 'vitest';
import { MAX_SAVED_CHECKS, MAX_SHEET_PROPERTIES, ProofSheetSchema, type ProofSheet } from '@shared/api/proof';
import type { CheckScript } from '@shared/checks';
import type { Property } from '@shared/proof';
import { addProperty, EMPTY_SHEET, labelProperty, removeCheck, removeProperty, replaceProperty, saveCheck } from '@/components/proof/sheetModel';
import { labProperties } from '@/components/proof/labProperties';
import { propertyKey } from '@/components/proof/runResults';

const interlock: Property = { never: { '%QX1': true, '%QX2': true } };
const amber: Property = { reachable: { P3: 'lit' } };
const script: CheckScript = { panel: 'reversing-conveyor', scanMs: 10, settleMs: 0, steps: [{ press: 'S2' }, { press: 'S3' }, { wait: 10 }, { expect: { '%QX1': true, '%QX2': true }, label: 'violated' }] };

function must(edit: ReturnType<typeof addProperty>): ProofSheet {
  if (!edit.ok) throw new Error(edit.error);
  return edit.sheet;
}

describe('editing a proof sheet', () => {
  it('adds, replaces and removes properties without changing the sheet it was given', () => {
    const one = must(addProperty(EMPTY_SHEET, interlock));
    expect(EMPTY_SHEET.properties).toEqual([]);
    const two = must(addProperty(one, amber));
    expect(two.properties).toEqual([interlock, amber]);
    expect(must(replaceProperty(two, 1, { reachable: { P1: 'lit' } })).properties[1]).toEqual({ reachable: { P1: 'lit' } });
    expect(must(removeProperty(two, 0)).properties).toEqual([amber]);
    expect(one.properties).toEqual([interlock]);
    expect(ProofSheetSchema.safeParse(two).success).toBe(true);
  });

  it('refuses a duplicate and a property past the limit', () => {
    const one = must(addProperty(EMPTY_SHEET, interlock));
    expect(addProperty(one, { ...interlock })).toEqual({ ok: false, error: 'This property is already on the sheet.' });
    const full: ProofSheet = { properties: Array.from({ length: MAX_SHEET_PROPERTIES }, (_, i) => ({ reachable: { [`%MX${i + 1}`]: true } })), checks: [] };
    expect(addProperty(full, amber).ok).toBe(false);
  });

  it('labels a property and gives it back its plain words when the label is cleared', () => {
    const one = must(addProperty(EMPTY_SHEET, interlock));
    const labelled = must(labelProperty(one, 0, '  interlock holds '));
    expect(labelled.properties[0]).toEqual({ ...interlock, label: 'interlock holds' });
    expect(must(labelProperty(labelled, 0, '')).properties[0]).toEqual(interlock);
    expect(labelProperty(one, 3, 'x').ok).toBe(false);
  });

  it('keeps a counterexample once, under the property’s label, and deletes it', () => {
    const kept = must(saveCheck(EMPTY_SHEET, 'K1 and K2 are never commanded together', script));
    expect(kept.checks).toEqual([{ label: 'K1 and K2 are never commanded together', script }]);
    expect(saveCheck(kept, 'again', script)).toEqual({ ok: false, error: 'This counterexample is already saved as a check.' });
    expect(ProofSheetSchema.safeParse(kept).success).toBe(true);
    expect(must(removeCheck(kept, 0)).checks).toEqual([]);
    const full: ProofSheet = { properties: [], checks: Array.from({ length: MAX_SAVED_CHECKS }, (_, i) => ({ label: `c${i}`, script: { ...script, title: `c${i}` } })) };
    expect(saveCheck(full, 'one more', script).ok).toBe(false);
  });

  it('clips a long label in the kept script to what a check script allows, so the sheet still saves', () => {
    const long = 'x'.repeat(200);
    const found: CheckScript = { ...script, title: `Counterexample: ${long}`, steps: [...script.steps.slice(0, 3), { expect: { '%QX1': true, '%QX2': true }, label: `violated: ${long}` }] };
    const kept = must(saveCheck(EMPTY_SHEET, long, found));
    expect(ProofSheetSchema.safeParse(kept).success).toBe(true);
    expect(kept.checks[0]!.script.title).toHaveLength(200);
    expect(kept.checks[0]!.script.steps[3]).toEqual({ expect: { '%QX1': true, '%QX2': true }, label: `violated: ${'x'.repeat(189)}…` });
    expect(kept.checks[0]!.script.steps.slice(0, 3)).toEqual(found.steps.slice(0, 3));
  });

  it('keys a result by the property’s content, so a new label keeps it', () => {
    expect(propertyKey({ ...interlock, label: 'a' })).toBe(propertyKey(interlock));
    expect(propertyKey(amber)).not.toBe(propertyKey(interlock));
  });
});

describe('a lab’s own properties', () => {
  it('come from the prove steps of its visible script, named by the step’s label', () => {
    const lab: CheckScript = {
      panel: 'reversing-conveyor',
      scanMs: 10,
      settleMs: 0,
      steps: [{ expect: { P2: 'lit' } }, { prove: { never: { '%QX1': true, '%QX2': true } }, label: 'interlock', points: 2, hidden: false }, { prove: { reachable: { P3: 'lit' }, label: 'own' } }],
    } as CheckScript;
    expect(labProperties(lab)).toEqual([{ ...interlock, label: 'interlock' }, { reachable: { P3: 'lit' }, label: 'own' }]);
    expect(labProperties(null)).toEqual([]);
  });
});
