/**
 * Demo programs for the Larch Hollow Timber Co. reversing conveyor (invented scenario, demo data).
 * Addresses follow the default `reversing-conveyor` panel layout in docs/names-and-rules.md, with
 * the tags every lab starts from. Each direction seals in on its contactor's auxiliary contact (K1
 * 13-14 on %IX7, K2 13-14 on %IX8), the pattern the three-wire lab teaches: when the overload drops
 * the contactor, the seal breaks, so resetting F1 does not restart the belt by itself.
 */
import type { Program } from '@shared/ladder/schema';
import { buildProgram, coil, nc, no, par, rung } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';

/** Three-wire start/stop, forward only: stop in series with start, sealed in by K1's auxiliary contact. */
export const THREE_WIRE_DEMO: Program = buildProgram(
  'Three-wire start/stop (demo)',
  'Demo: Larch Hollow Timber Co. conveyor, forward only. S1 is a normally closed button, so the NO contact on %IX1 passes power at rest. ' +
    'The seal-in is K1\'s auxiliary contact (%IX7), which reports what the contactor really does.',
  conveyorTags(),
  [rung('Start forward; seal in on K1\'s auxiliary contact; stop breaks the seal', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil'))],
);

/** Forward/reverse with electrical interlocks and a red "stopped" lamp. */
export const REVERSING_DEMO: Program = buildProgram(
  'Forward/reverse with interlocks (demo)',
  'Demo: Larch Hollow Timber Co. reversing conveyor. Each direction is sealed in on its contactor\'s auxiliary contact and blocked while the other is commanded.',
  conveyorTags(),
  [
    rung('Forward, interlocked against reverse', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), nc('K2_Coil'), coil('K1_Coil')),
    rung('Reverse, interlocked against forward', no('Stop_PB'), par(no('Rev_PB'), no('K2_Aux')), nc('K1_Coil'), coil('K2_Coil')),
    rung('Red lamp while neither contactor is closed', nc('K1_Aux'), nc('K2_Aux'), coil('Red_Lamp')),
  ],
);

/**
 * A demo submission to the forward/reverse lab with the interlocks left out (demo data): each
 * direction seals in, but nothing stops both contactors being commanded at once.
 */
export const MISSING_INTERLOCK_DEMO: Program = buildProgram('Forward/reverse, no interlock (demo)', 'Demo: a first try at the Larch Hollow reversing conveyor that forgets the interlocks.', conveyorTags(), [
  rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')),
  rung('', no('Stop_PB'), par(no('Rev_PB'), no('K2_Aux')), coil('K2_Coil')),
  rung('', no('K1_Aux'), coil('Green_Lamp')),
  rung('', no('K2_Aux'), coil('Amber_Lamp')),
  rung('', nc('K1_Aux'), nc('K2_Aux'), coil('Red_Lamp')),
]);
