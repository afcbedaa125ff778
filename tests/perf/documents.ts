/**
 * Documents the benchmarks send: a realistic student program of 20 rungs (8,912 bytes of JSON,
 * the size of a finished lab with tags and rung comments), built from the simulator's three-wire
 * demo and the kinds of rungs the labs ask for. Demo data (Larch Hollow Timber Co., invented).
 */
import { block, buildProgram, coil, nc, no, par, rung, ser } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import type { NetworkNode, Program } from '@shared/ladder/schema';
import { threeWireProgram } from '../../src/simulation/demoPrograms';

const INPUTS = ['Stop_PB', 'Fwd_PB', 'Rev_PB', 'Run_Sel', 'Box_Eye', 'K1_Aux', 'K2_Aux'];

/** The three-wire demo's 7 rungs and 13 more: lamps, interlocks, timers and counters. */
export function realisticDocument(): Program {
  const extra = Array.from({ length: 13 }, (_, i) => {
    const a = INPUTS[i % INPUTS.length]!;
    const b = INPUTS[(i * 3 + 2) % INPUTS.length]!;
    const m = `%MX${i + 1}`;
    switch (i % 4) {
      case 0:
        return rung(`Step ${i + 1}: remember that ${a} was seen while ${b} is off`, par(no(a), no(m)), nc(b), coil(m));
      case 1:
        return rung(`Step ${i + 1}: wait 2 s after ${a} before the next step`, no(a), no(`%MX${i}`), block('TON', `T${i + 2}`, { PT: 'T#2s' }));
      case 2:
        return rung(`Step ${i + 1}: count boxes on the photo-eye, reset at stop`, no('Box_Eye'), block('CTU', `C${i + 1}`, { PV: '5', R: 'Stop_PB' }));
      default:
        return rung(`Step ${i + 1}: lamp test while ${a} and not ${b}`, ser(no(a), nc(b)), coil(m));
    }
  });
  const demo = threeWireProgram();
  // The two parts number their ids alike; the added rungs' ids get an `x` in front.
  const renamed = (node: NetworkNode): NetworkNode =>
    node.kind === 'series' ? { ...node, id: `x${node.id}`, items: node.items.map(renamed) } : node.kind === 'parallel' ? { ...node, id: `x${node.id}`, branches: node.branches.map(renamed) } : { ...node, id: `x${node.id}` };
  const added = buildProgram('', '', [], extra).rungs.map((r) => ({ ...r, id: `x${r.id}`, network: renamed(r.network) as typeof r.network }));
  return { ...demo, title: 'Reversing conveyor with batch counter (demo)', tags: conveyorTags(), rungs: [...demo.rungs, ...added] };
}
