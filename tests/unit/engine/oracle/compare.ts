/**
 * Running the engine and the reference runtime side by side on the same inputs and forces,
 * comparing the whole state (the snapshot: bits, field, edge memories, every block's fields,
 * forces, time) and the power flow of every node after every scan.
 */
import { createRuntime, type Plan, type Runtime } from '@shared/engine';
import { createReferenceRuntime } from './referenceRuntime';

export interface Divergence {
  scan: number;
  what: string;
  engine: string;
  reference: string;
}

/** A seeded run: inputs change every few scans; forces come and go on the way. */
export function compareRuns(plan: Plan, scans: number, seed: number): Divergence | null {
  const engine: Runtime = createRuntime(plan, { recordPowerFlow: true });
  const reference = createReferenceRuntime(plan);
  let a = seed >>> 0;
  const next = (): number => {
    a = (Math.imul(a, 1664525) + 1013904223) >>> 0;
    return a / 4294967296;
  };
  const { inputs, outputs } = plan.space;
  for (let k = 0; k < scans; k += 1) {
    if (k % 3 === 0) {
      for (let i = 1; i <= inputs; i += 1) {
        if (next() < 0.3) {
          const v = next() < 0.5;
          engine.setInput(i, v);
          reference.setInput(i, v);
        }
      }
    }
    const force = (operand: string, value: boolean): void => {
      engine.force(operand, value);
      reference.force(operand, value);
    };
    if (k === Math.floor(scans / 3)) force(`%QX${Math.min(2, outputs)}`, true);
    if (k === Math.floor(scans / 2)) force('%IX1', false);
    if (k === Math.floor((2 * scans) / 3)) {
      engine.clearForces();
      reference.clearForces();
    }
    engine.scan();
    reference.scan();
    const x = JSON.stringify(engine.snapshot());
    const y = JSON.stringify(reference.snapshot());
    if (x !== y) return { scan: k + 1, what: 'state', engine: x, reference: y };
    const flow = engine.powerFlow();
    const left = plan.flowIds.map((id) => (flow.get(id)!.left ? 1 : 0)).join('');
    const right = plan.flowIds.map((id) => (flow.get(id)!.right ? 1 : 0)).join('');
    const refLeft = Array.from(reference.flow.left).join('');
    const refRight = Array.from(reference.flow.right).join('');
    if (left !== refLeft || right !== refRight) return { scan: k + 1, what: 'power flow', engine: `${left}/${right}`, reference: `${refLeft}/${refRight}` };
  }
  return null;
}
