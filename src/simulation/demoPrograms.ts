/**
 * Demo programs for the simulator (demo scenario, invented: the Larch Hollow Timber Co. reversing
 * infeed conveyor on the `reversing-conveyor` panel). Three-wire and two-wire control are the
 * classic circuits of T. R. Kuphaldt, *Lessons in Electric Circuits*, Vol. IV, ch. 6; the large
 * program is generated, for the benchmark and for trying the live view on a long program.
 */
import { block, buildProgram, coil, nc, no, par, rung, ser, type RungDraft } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import type { Program } from '@shared/ladder/schema';

/** The demo programs the simulator offers, by route id. */
export type DemoProgramId = 'three-wire' | 'two-wire' | 'large';

/** Lamps shared by both demos: green while a contactor is closed, red at rest, amber on overload. */
function lampRungs(): RungDraft[] {
  return [
    rung('Green lamp: the belt runs (either contactor reports closed)', par(no('K1_Aux'), no('K2_Aux')), coil('Green_Lamp')),
    rung('Red lamp: at rest (neither contactor closed)', nc('K1_Aux'), nc('K2_Aux'), coil('Red_Lamp')),
    rung('Amber lamp: the overload has tripped', no('OL_Tripped'), coil('Amber_Lamp')),
  ];
}

/**
 * Three-wire forward/reverse: NC stop (examined by a NO contact, so TRUE at rest), start in
 * parallel with the seal-in on the contactor's auxiliary contact (K1 13-14 on %IX7, K2 13-14 on
 * %IX8: what the contactor really does, so an overload trip breaks the seal and resetting F1 does
 * not restart the belt), the other direction's output in series as the software interlock. At JOG
 * (S4) the seal-in is defeated, so the belt runs only while a start button is held. A box held at
 * the belt end for 5 s while running forward sounds the horn.
 */
function threeWireRungs(): RungDraft[] {
  return [
    rung(
      'Forward: stop AND (forward OR K1 closed at RUN) AND NOT reverse',
      no('Stop_PB'),
      par(no('Fwd_PB'), ser(no('K1_Aux'), no('Run_Sel'))),
      nc('K2_Coil'),
      coil('K1_Coil'),
    ),
    rung(
      'Reverse: stop AND (reverse OR K2 closed at RUN) AND NOT forward',
      no('Stop_PB'),
      par(no('Rev_PB'), ser(no('K2_Aux'), no('Run_Sel'))),
      nc('K1_Coil'),
      coil('K2_Coil'),
    ),
    ...lampRungs(),
    rung('Jam warning: a box blocks the belt end for 5 s while running forward', no('Box_Eye'), no('K1_Aux'), block('TON', 'T1', { PT: 'T#5s' })),
    rung('Horn while the jam timer is done', no('T1.Q'), coil('Horn')),
  ];
}

/** The three-wire demo (see `threeWireRungs`). */
export function threeWireProgram(): Program {
  return buildProgram(
    'Three-wire reversing conveyor (demo)',
    'Demo, invented scenario: the Larch Hollow Timber Co. infeed belt. Start/stop sealed in on the contactors\' auxiliary contacts, forward/reverse interlock, jog at JOG.',
    conveyorTags(),
    threeWireRungs(),
  );
}

/**
 * Two-wire control: the forward contactor follows the maintained selector (S4 at RUN) and the stop
 * button. It restarts by itself when the e-stop is reset — the reason three-wire control exists.
 */
export function twoWireProgram(): Program {
  return buildProgram(
    'Two-wire conveyor (demo)',
    'Demo, invented scenario: the belt follows the maintained selector S4. Reset the e-stop and watch it restart.',
    conveyorTags(),
    [rung('Forward while S4 is at RUN and stop is not pressed', no('Run_Sel'), no('Stop_PB'), coil('K1_Coil')), ...lampRungs()],
  );
}

/**
 * A generated program of `rungCount` rungs on the default panel: the three-wire rungs first, then
 * rungs of memory bits, branches, timers and counters, deterministic (no random source), about
 * 6-8 elements a rung. For the benchmark and for trying the live view on a long program.
 */
export function largeProgram(rungCount = 200): Program {
  const drafts = threeWireRungs();
  const inputs = ['Stop_PB', 'Fwd_PB', 'Rev_PB', 'Run_Sel', 'Box_Eye', 'K1_Aux', 'K2_Aux'];
  const mem = (n: number): string => `%MX${(((n % 64) + 64) % 64) + 1}`;
  for (let i = drafts.length; i < rungCount; i += 1) {
    const a = inputs[i % inputs.length]!;
    const b = inputs[(i * 3 + 1) % inputs.length]!;
    const kind = i % 10;
    if (kind === 3) {
      drafts.push(rung(`Generated ${i + 1}: on-delay`, no(a), nc(mem(i - 1)), block('TON', `T${i}`, { PT: `T#${(i % 7) + 1}s` })));
    } else if (kind === 7) {
      drafts.push(rung(`Generated ${i + 1}: counter`, no(b), block('CTU', `C${i}`, { R: 'Stop_PB', PV: String((i % 5) + 2) })));
    } else {
      drafts.push(
        rung(
          `Generated ${i + 1}: memory logic`,
          par(no(a), ser(no(mem(i - 2)), nc(b))),
          no(mem(i - 5)),
          par(nc(mem(i - 9)), no(a)),
          coil(mem(i)),
        ),
      );
    }
  }
  return buildProgram(`Large generated program, ${rungCount} rungs (demo)`, 'Demo: generated for the benchmark.', conveyorTags(), drafts);
}

/** A demo program by id, or null for an id that is not a demo. */
export function demoProgram(id: string): Program | null {
  const table = { 'three-wire': threeWireProgram, 'two-wire': twoWireProgram, large: () => largeProgram(200) } satisfies Record<
    DemoProgramId,
    () => Program
  >;
  return id in table ? table[id as DemoProgramId]() : null;
}

/** What the simulator's program picker lists. */
export const DEMO_PROGRAMS: readonly { id: DemoProgramId; title: string }[] = [
  { id: 'three-wire', title: 'Three-wire reversing (demo)' },
  { id: 'two-wire', title: 'Two-wire (demo)' },
  { id: 'large', title: 'Large generated program, 200 rungs (demo)' },
];
