import { describe, expect, it } from 'vitest';
import { createRuntime, createTrace } from '@shared/engine';
import { planOf, programBuilder } from './build';

function timer() {
  const b = programBuilder();
  return planOf(
    b.program([b.rung(b.no('Run'), b.block('TON', 'T1', { PT: 'T#20ms' }), b.coil('%QX1'))], [{ name: 'Run', address: '%IX1', comment: '' }]),
  );
}

describe('the trace', () => {
  it('records the asked-for signals after each scan as 0/1 and numbers', () => {
    const rt = createRuntime(timer());
    const trace = createTrace(rt, ['Run', 'T1.ET', '%QX1']);
    rt.setInput(1, true);
    for (let i = 0; i < 3; i += 1) {
      rt.scan();
      trace.record();
    }
    expect(trace.toCSV()).toBe(['time_ms,scan,Run,T1.ET,%QX1', '10,1,1,10,0', '20,2,1,20,1', '30,3,1,20,1', ''].join('\n'));
  });

  it('keeps rows as values with their time and scan number', () => {
    const rt = createRuntime(timer());
    const trace = createTrace(rt, ['T1.Q']);
    rt.scan();
    trace.record();
    expect(trace.rows()).toEqual([{ timeMs: 10, scan: 1, values: [false], forced: [false] }]);
    trace.clear();
    expect(trace.rows()).toEqual([]);
  });

  it('lists signals that name nothing and leaves their cells empty', () => {
    const rt = createRuntime(timer());
    const trace = createTrace(rt, ['Nothing', '%QX1']);
    expect(trace.unresolved).toEqual(['Nothing']);
    rt.scan();
    trace.record();
    expect(trace.toCSV()).toBe('time_ms,scan,Nothing,%QX1\n10,1,,0\n');
  });

  it('quotes a header cell that would break the CSV', () => {
    const rt = createRuntime(timer());
    expect(createTrace(rt, ['a,b']).toCSV()).toBe('time_ms,scan,"a,b"\n');
  });
});
