/** Test helpers: programs on the default panel and a simulation that must start. */
import { createSimulation, REVERSING_CONVEYOR, type PanelLayout, type Simulation } from '@shared/field';
import { buildProgram, coil, nc, no, par, rung, type RungDraft } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import type { Program } from '@shared/ladder/schema';

export function program(...rungs: RungDraft[]): Program {
  return buildProgram('test', '', conveyorTags(), rungs);
}

export function simulate(p: Program, panel: PanelLayout = REVERSING_CONVEYOR, scanMs = 10): Simulation {
  const result = createSimulation({ program: p, panel, scanMs });
  if (!result.ok) throw new Error(result.error);
  return result.simulation;
}

/** Three-wire: stop (NC button, NO contact) AND (start OR K1 aux) -> K1. */
export const threeWire = (): Program => program(rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')));

/** Two-wire: selector at RUN AND stop -> K1. */
export const twoWire = (): Program => program(rung('', no('Stop_PB'), no('Run_Sel'), coil('K1_Coil')));

/** Forward and reverse with no interlock at all in the program. */
export const noInterlock = (): Program =>
  program(
    rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')),
    rung('', no('Stop_PB'), par(no('Rev_PB'), no('K2_Aux')), coil('K2_Coil')),
  );

/** Every output ON whatever happens (to see the hardwired circuits act alone). */
export const allOutputsOn = (): Program =>
  program(rung('', par(no('Stop_PB'), nc('Stop_PB')), coil('Green_Lamp'), coil('Red_Lamp'), coil('Amber_Lamp'), coil('Horn')));

export function pulse(sim: Simulation, id: string, holdMs = 100, afterMs = 100): void {
  sim.press(id);
  sim.run(holdMs);
  sim.release(id);
  sim.run(afterMs);
}
