import { describe, expect, it } from 'vitest';
import { createRuntime, createTrace, type Runtime } from '@shared/engine';
import { DEMO_BATCH, DEMO_HORN_MS, demoProgram } from '../../perf/engine-demo';
import { planOf } from './build';

/**
 * The reversing conveyor (demo data) on an engine-only harness: inputs set directly. At rest the
 * stop button's NC contact is closed, so %IX1 reads TRUE (docs/names-and-rules.md, common practice).
 */
function atRest(): Runtime {
  const rt = createRuntime(planOf(demoProgram()));
  rt.setInputs([true, false, false, true, false, false, false, false]);
  rt.run(50);
  return rt;
}

function press(rt: Runtime, input: number, ms = 100): void {
  const before = rt.read(`%IX${input}`) as boolean;
  rt.setInput(input, !before);
  rt.run(ms);
  rt.setInput(input, before);
  rt.run(ms);
}

describe('the reversing conveyor program', () => {
  it('shows the red lamp at rest with both contactors off', () => {
    const rt = atRest();
    expect([rt.read('K1'), rt.read('K2'), rt.read('P2')]).toEqual([false, false, true]);
  });

  it('runs forward sealed in after S2 is released, with the horn for its time', () => {
    const rt = atRest();
    const trace = createTrace(rt, ['K1', 'H1', 'P1', 'T1.ET']);
    press(rt, 2);
    expect([rt.read('K1'), rt.read('P1'), rt.read('P2'), rt.read('H1')]).toEqual([true, true, false, true]);
    for (let t = 0; t < DEMO_HORN_MS; t += 10) {
      rt.scan();
      trace.record();
    }
    expect(rt.read('H1')).toBe(false);
    expect(rt.read('K1')).toBe(true);
    const hornOff = trace.rows().find((row) => row.values[1] === false)!;
    // Pressed at 50 ms: the timer started in the scan K1 picked up, so the horn stops 3 s later.
    expect(hornOff.timeMs).toBe(50 + DEMO_HORN_MS);
  });

  it('ignores reverse while forward runs (interlock) and stops on S1', () => {
    const rt = atRest();
    press(rt, 2);
    press(rt, 3);
    expect([rt.read('K1'), rt.read('K2')]).toEqual([true, false]);
    press(rt, 1);
    expect([rt.read('K1'), rt.read('K2'), rt.read('P2')]).toEqual([false, false, true]);
    press(rt, 3);
    expect([rt.read('K1'), rt.read('K2')]).toEqual([false, true]);
  });

  it('drops the contactor when F1 trips and will not restart until it is reset', () => {
    const rt = atRest();
    press(rt, 2);
    rt.setInput(6, true);
    rt.scan();
    expect(rt.read('K1')).toBe(false);
    press(rt, 2);
    expect(rt.read('K1')).toBe(false);
    rt.setInput(6, false);
    rt.run(100);
    expect(rt.read('K1')).toBe(false);
  });

  it('lights the amber lamp once a batch of boxes has passed the photo-eye', () => {
    const rt = atRest();
    for (let box = 1; box <= DEMO_BATCH; box += 1) {
      expect(rt.read('P3')).toBe(false);
      press(rt, 5, 40);
    }
    expect(rt.read('C1.CV')).toBe(DEMO_BATCH);
    expect(rt.read('P3')).toBe(true);
    rt.force('%MX1', true);
    rt.scan();
    expect([rt.read('C1.CV'), rt.read('P3')]).toEqual([0, false]);
  });
});
