/**
 * The field values are kept as one bit per input in 32-bit words (stateLayout.ts); these tests
 * cover the word edges: a panel of 64 inputs (two words), `setInputs` with fewer values than
 * inputs (the rest keep their value), `setInput` on either side of a word boundary, and snapshots.
 * A scan spreads a field word into the input image only when the word changed since the last
 * spread; the last block covers everything else that writes the image (forces, restore, restart).
 */
import { describe, expect, it } from 'vitest';
import { compile, createRuntime, type Plan, type Runtime } from '@shared/engine';
import type { AddressSpace } from '@shared/ladder/addresses';
import { programBuilder } from './build';
import { createReferenceRuntime } from './oracle/referenceRuntime';

const WIDE: AddressSpace = { inputs: 64, outputs: 64, memory: 8 };

/** Each output `%QXn` follows input `%IXn`, so the output image shows every input the scan read. */
function widePlan(): Plan {
  const b = programBuilder();
  const rungs = Array.from({ length: 64 }, (_, i) => b.rung(b.no(`%IX${i + 1}`), b.coil(`%QX${i + 1}`)));
  const compiled = compile(b.program(rungs), { space: WIDE });
  if (!compiled.ok) throw new Error(compiled.diagnostics[0]!.message);
  return compiled.plan;
}

const outputs = (rt: Runtime): boolean[] => Array.from({ length: 64 }, (_, i) => rt.getOutput(i + 1));

describe('the field inputs', () => {
  it('reach the scan for all 64 inputs of a wide panel, given at once', () => {
    const rt = createRuntime(widePlan());
    const values = Array.from({ length: 64 }, (_, i) => i % 3 === 0 || i === 31 || i === 32 || i === 63);
    rt.setInputs(values);
    rt.scan();
    expect(outputs(rt)).toEqual(values);
    rt.setInputs(values.map((v) => !v));
    rt.scan();
    expect(outputs(rt)).toEqual(values.map((v) => !v));
  });

  it('keep their value past the end of a shorter list', () => {
    const rt = createRuntime(widePlan());
    rt.setInputs(Array.from({ length: 64 }, () => true));
    rt.setInputs([false, false, false]);
    rt.scan();
    expect(outputs(rt)).toEqual(Array.from({ length: 64 }, (_, i) => i >= 3));
    rt.setInputs(Array.from({ length: 40 }, () => false));
    rt.scan();
    expect(outputs(rt)).toEqual(Array.from({ length: 64 }, (_, i) => i >= 40));
  });

  it('change one at a time on either side of a word boundary', () => {
    const rt = createRuntime(widePlan());
    for (const index of [1, 32, 33, 64]) rt.setInput(index, true);
    rt.scan();
    expect(outputs(rt).flatMap((on, i) => (on ? [i + 1] : []))).toEqual([1, 32, 33, 64]);
    rt.setInput(32, false);
    rt.setInput(33, false);
    rt.scan();
    expect(outputs(rt).flatMap((on, i) => (on ? [i + 1] : []))).toEqual([1, 64]);
  });

  it('agree with the reference runtime, forces included', () => {
    const plan = widePlan();
    const rt = createRuntime(plan);
    const reference = createReferenceRuntime(plan);
    let a = 5;
    for (let k = 0; k < 200; k += 1) {
      const values = Array.from({ length: 64 }, () => {
        a = (Math.imul(a, 1664525) + 1013904223) >>> 0;
        return a < 2 ** 31;
      });
      rt.setInputs(values);
      values.forEach((v, i) => reference.setInput(i + 1, v));
      if (k === 50) {
        rt.force('%IX40', true);
        reference.force('%IX40', true);
      }
      if (k === 120) {
        rt.clearForces();
        reference.clearForces();
      }
      rt.scan();
      reference.scan();
      expect(JSON.stringify(rt.snapshot())).toBe(JSON.stringify(reference.snapshot()));
    }
  });

  it('are in a snapshot one value per input, and come back from it', () => {
    const plan = widePlan();
    const rt = createRuntime(plan);
    rt.setInput(2, true);
    rt.setInput(35, true);
    const snapshot = rt.snapshot();
    expect(snapshot.field.flatMap((v, i) => (v === 1 ? [i + 1] : []))).toEqual([2, 35]);
    const other = createRuntime(plan);
    other.restore(snapshot);
    other.scan();
    expect(outputs(other).flatMap((on, i) => (on ? [i + 1] : []))).toEqual([2, 35]);
  });

  describe('are spread into the input image again when the image was written from outside', () => {
    const first = (rt: Runtime): boolean => rt.getOutput(1);

    it('after a force on an input is released, scanned in between or not', () => {
      for (const scanWhileForced of [true, false]) {
        const rt = createRuntime(widePlan());
        rt.scan();
        rt.force('%IX1', true);
        if (scanWhileForced) {
          rt.scan();
          expect(first(rt)).toBe(true);
        }
        rt.unforce('%IX1');
        rt.scan();
        expect(first(rt)).toBe(false);
      }
    });

    it('after a restore whose image the field had not reached yet', () => {
      const plan = widePlan();
      const given = createRuntime(plan);
      given.setInput(1, true);
      const taken = given.snapshot();
      expect(taken.bits.inputs[0]).toBe(0);
      const rt = createRuntime(plan);
      rt.setInput(1, true);
      rt.scan();
      rt.restore(taken);
      rt.scan();
      expect(first(rt)).toBe(true);
    });

    it('after a power cycle, which clears the image', () => {
      const rt = createRuntime(widePlan());
      rt.setInput(1, true);
      rt.scan();
      rt.powerOff();
      rt.powerOn();
      rt.scan();
      expect(first(rt)).toBe(true);
    });
  });
});
