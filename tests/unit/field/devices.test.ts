import { describe, expect, it } from 'vitest';
import {
  DEVICE_KINDS,
  DEVICE_MODELS,
  interlockRule,
  isEngaged,
  resetLevel,
  thermalLevel,
  type ContactorState,
  type DeviceInputs,
  type MotorState,
  type OverloadState,
} from '@shared/field';

const idle: DeviceInputs = { energised: false, blocked: false, conflict: false, supply: 'none', currentA: 0 };
const inputs = (over: Partial<DeviceInputs>): DeviceInputs => ({ ...idle, ...over });

function act<S>(result: { ok: true; state: S } | { ok: false; error: string }): S {
  if (!result.ok) throw new Error(result.error);
  return result.state;
}

describe('the device table', () => {
  it('describes every kind with parameters, words and a noun', () => {
    for (const kind of DEVICE_KINDS) {
      const model = DEVICE_MODELS[kind];
      expect(model.kind).toBe(kind);
      expect(model.noun).toMatch(/^an? /);
    }
    expect(DEVICE_KINDS).toHaveLength(11);
  });
});

describe('contacts follow the state word (the simulation relies on it to skip work)', () => {
  it('gives the same contacts for states that differ only below the word', () => {
    const k = DEVICE_MODELS.contactor;
    const kp = k.params.parse({});
    const picking = k.step!(k.initial(kp), kp, inputs({ energised: true }), 10);
    expect(k.word(picking, kp)).toBe(k.word(k.initial(kp), kp));
    expect(k.contacts(kp).map((c) => k.isClosed(picking, kp, c.name))).toEqual(k.contacts(kp).map((c) => k.isClosed(k.initial(kp), kp, c.name)));
    const f = DEVICE_MODELS.overload;
    const fp = f.params.parse({ settingA: 2.4 });
    const warm = f.step!(f.initial(fp), fp, inputs({ currentA: 3 }), 60_000);
    expect(warm.theta).toBeGreaterThan(0);
    expect(f.word(warm, fp)).toBe('ok');
    expect(f.contacts(fp).map((c) => f.isClosed(warm, fp, c.name))).toEqual([true, false]);
  });
});

describe('momentary pushbutton', () => {
  const pb = DEVICE_MODELS.pushbutton;
  it('an NO button closes 13-14 only while pressed', () => {
    const p = pb.params.parse({ form: 'NO', colour: 'green' });
    const rest = pb.initial(p);
    expect(pb.isClosed(rest, p, '13-14')).toBe(false);
    const pressed = act(pb.actions.press!(rest, p, {}));
    expect(pb.isClosed(pressed, p, '13-14')).toBe(true);
    expect(pb.word(pressed, p)).toBe('pressed');
    expect(pb.isClosed(act(pb.actions.release!(pressed, p, {})), p, '13-14')).toBe(false);
  });
  it('an NC button is closed at rest and opens 11-12 while pressed (common practice)', () => {
    const p = pb.params.parse({ form: 'NC', colour: 'red' });
    expect(pb.contacts(p)).toEqual([{ name: '11-12', form: 'NC' }]);
    const rest = pb.initial(p);
    expect(pb.isClosed(rest, p, '11-12')).toBe(true);
    expect(pb.isClosed(act(pb.actions.press!(rest, p, {})), p, '11-12')).toBe(false);
  });
  it('refuses a colour outside IEC 60073', () => {
    expect(pb.params.safeParse({ form: 'NO', colour: 'purple' }).success).toBe(false);
  });
});

describe('latching emergency stop', () => {
  const es = DEVICE_MODELS.estop;
  const p = es.params.parse({});
  it('stays open after a press until it is released by hand (ISO 13850)', () => {
    const latched = act(es.actions.press!(es.initial(p), p, {}));
    expect(es.isClosed(latched, p, '11-12')).toBe(false);
    expect(es.isClosed(latched, p, '21-22')).toBe(false);
    expect(es.word(latched, p)).toBe('pressed');
    const released = act(es.actions.release!(latched, p, {}));
    expect(es.isClosed(released, p, '11-12')).toBe(true);
    expect(es.isClosed(act(es.actions.reset!(latched, p, {})), p, '21-22')).toBe(true);
  });
});

describe('selector switch', () => {
  const sel = DEVICE_MODELS.selector;
  const p = sel.params.parse({ positions: ['JOG', 'RUN'], initial: 'JOG' });
  it('closes the contact of the position it is at and stays there', () => {
    const rest = sel.initial(p);
    expect(sel.isClosed(rest, p, 'RUN')).toBe(false);
    expect(sel.isClosed(rest, p, 'JOG')).toBe(true);
    const run = act(sel.actions.set!(rest, p, { to: 'RUN' }));
    expect(sel.isClosed(run, p, 'RUN')).toBe(true);
    expect(sel.word(run, p)).toBe('RUN');
  });
  it('refuses a position it does not have, naming the ones it has', () => {
    const result = sel.actions.set!(sel.initial(p), p, { to: 'AUTO' });
    expect(result).toEqual({ ok: false, error: 'position "AUTO" does not exist; it has JOG, RUN' });
  });
  it('rejects duplicate positions and an unknown initial position', () => {
    expect(sel.params.safeParse({ positions: ['A', 'A'] }).success).toBe(false);
    expect(sel.params.safeParse({ positions: ['A', 'B'], initial: 'C' }).success).toBe(false);
  });
});

describe('contactor', () => {
  const k = DEVICE_MODELS.contactor;
  const p = k.params.parse({ pickUpMs: 25, dropOutMs: 15 });
  const stepFor = (state: ContactorState, ms: number, over: Partial<DeviceInputs>): ContactorState => {
    let s = state;
    for (let t = 0; t < ms; t += 5) s = k.step!(s, p, inputs(over), 5);
    return s;
  };
  it('picks up only after the pick-up delay and its auxiliary contacts follow the carrier', () => {
    const open = k.initial(p);
    const almost = stepFor(open, 20, { energised: true });
    expect(almost.closed).toBe(false);
    expect(isEngaged(almost)).toBe(true);
    const closed = stepFor(almost, 5, { energised: true });
    expect(closed.closed).toBe(true);
    expect(k.isClosed(closed, p, '13-14')).toBe(true);
    expect(k.isClosed(closed, p, '21-22')).toBe(false);
  });
  it('drops out after the drop-out delay', () => {
    const closed = stepFor(k.initial(p), 25, { energised: true });
    expect(stepFor(closed, 10, {}).closed).toBe(true);
    expect(stepFor(closed, 15, {}).closed).toBe(false);
  });
  it('a coil pulse shorter than the pick-up delay does not close it', () => {
    const s = stepFor(stepFor(k.initial(p), 10, { energised: true }), 50, {});
    expect(s.closed).toBe(false);
    expect(s.movingMs).toBe(0);
  });
  it('is held open while an interlock blocks it and says so', () => {
    const s = stepFor(k.initial(p), 100, { energised: true, blocked: true });
    expect(s.closed).toBe(false);
    expect(s.held).toBe(true);
  });
  it('returns the same state object when nothing changes', () => {
    const open = k.initial(p);
    expect(k.step!(open, p, idle, 10)).toBe(open);
  });
});

describe('mechanical interlock rule (docs/names-and-rules.md)', () => {
  it('holds the other contactor open once one is engaged', () => {
    expect(interlockRule(true, true, true, false)).toEqual({ blockA: false, blockB: true, conflict: false });
  });
  it('lets neither close when both coils are energised while both are open, and reports a conflict', () => {
    expect(interlockRule(true, false, true, false)).toEqual({ blockA: true, blockB: true, conflict: true });
  });
  it('does nothing when only one coil is energised', () => {
    expect(interlockRule(true, false, false, false)).toEqual({ blockA: false, blockB: false, conflict: false });
  });
});

describe('thermal overload relay', () => {
  const f = DEVICE_MODELS.overload;
  const p = f.params.parse({ settingA: 2.4, tripClass: '10' });
  it('offers 95-96 NC and 97-98 NO, which swap when it trips by hand', () => {
    const ok = f.initial(p);
    expect(f.isClosed(ok, p, '95-96')).toBe(true);
    expect(f.isClosed(ok, p, '97-98')).toBe(false);
    const tripped = act(f.actions.trip!(ok, p, {}));
    expect(f.word(tripped, p)).toBe('tripped');
    expect(f.isClosed(tripped, p, '95-96')).toBe(false);
    expect(f.isClosed(tripped, p, '97-98')).toBe(true);
  });
  it('resets at once after a test trip from cold', () => {
    const tripped = act(f.actions.trip!(f.initial(p), p, {}));
    expect(f.word(act(f.actions.reset!(tripped, p, {})), p)).toBe('ok');
  });
  it('trips on overcurrent, latches, and refuses a reset until cooled to 1/k² of the trip level', () => {
    let s: OverloadState = f.initial(p);
    let ms = 0;
    while (!s.tripped && ms < 60_000) {
      s = f.step!(s, p, inputs({ currentA: 6 * 2.4 }), 10);
      ms += 10;
    }
    expect(s.tripped).toBe(true);
    expect(s.cause).toBe('thermal');
    s = f.step!(s, p, idle, 10);
    const refusedReset = f.actions.reset!(s, p, {});
    expect(refusedReset.ok).toBe(false);
    if (!refusedReset.ok) expect(refusedReset.error).toMatch(/^still too hot to reset: thermal level 1\.00 of trip, resets at 0\.79 \(about \d+ s more/);
    for (let t = 0; t < 80_000; t += 10) s = f.step!(s, p, idle, 10);
    expect(thermalLevel(s, p)).toBeLessThanOrEqual(resetLevel(p));
    expect(f.word(act(f.actions.reset!(s, p, {})), p)).toBe('ok');
  });
  it('cools to exactly cold and then stops changing', () => {
    let s: OverloadState = f.step!(f.initial(p), p, inputs({ currentA: 2.4 }), 10);
    for (let t = 0; t < 20 * 3_600_000; t += 60_000) s = f.step!(s, p, idle, 60_000);
    expect(s.theta).toBe(0);
    const settled = f.step!(s, p, idle, 10);
    expect(f.step!(settled, p, idle, 10)).toBe(settled);
  });
});

describe('three-phase motor', () => {
  const m = DEVICE_MODELS.motor;
  const p = m.params.parse({ flaA: 2.4, rampMs: 500, coastMs: 800 });
  const run = (state: MotorState, ms: number, supply: DeviceInputs['supply']): MotorState => {
    let s = state;
    for (let t = 0; t < ms; t += 10) s = m.step!(s, p, inputs({ supply }), 10);
    return s;
  };
  it('draws about 6 × FLA while starting and load factor × FLA at speed (common practice)', () => {
    const starting = run(m.initial(p), 100, 'forward');
    expect(m.word(starting, p)).toBe('forward');
    expect(starting.currentA).toBeCloseTo(6 * 2.4, 6);
    const atSpeed = run(starting, 500, 'forward');
    expect(atSpeed.speed).toBe(1);
    expect(atSpeed.currentA).toBeCloseTo(2.4, 6);
    const loaded = run(act(m.actions.load!(atSpeed, p, { factor: 1.5 })), 10, 'forward');
    expect(loaded.currentA).toBeCloseTo(3.6, 6);
  });
  it('draws the starting current while plugged (reversed while still turning) and then turns in reverse', () => {
    const forward = run(m.initial(p), 600, 'forward');
    const plugging = run(forward, 200, 'reverse');
    expect(plugging.speed).toBeGreaterThan(0);
    expect(plugging.currentA).toBeCloseTo(6 * 2.4, 6);
    const reverse = run(plugging, 1000, 'reverse');
    expect(m.word(reverse, p)).toBe('reverse');
    expect(reverse.currentA).toBeCloseTo(2.4, 6);
  });
  it('coasts to rest without supply and draws no current', () => {
    const forward = run(m.initial(p), 600, 'forward');
    const coasting = run(forward, 400, 'none');
    expect(coasting.currentA).toBe(0);
    expect(m.word(coasting, p)).toBe('forward');
    expect(m.word(run(coasting, 500, 'none'), p)).toBe('stopped');
  });
  it('refuses a load factor outside 0..20', () => {
    expect(m.actions.load!(m.initial(p), p, { factor: -1 }).ok).toBe(false);
    expect(m.actions.load!(m.initial(p), p, { factor: 25 }).ok).toBe(false);
  });
});

describe('lamp, horn and sensors', () => {
  it('a lamp is lit and a horn sounds exactly while energised', () => {
    const lamp = DEVICE_MODELS.lamp;
    const lp = lamp.params.parse({ colour: 'green' });
    const lit = lamp.step!(lamp.initial(lp), lp, inputs({ energised: true }), 10);
    expect(lamp.word(lit, lp)).toBe('lit');
    expect(lamp.word(lamp.step!(lit, lp, idle, 10), lp)).toBe('dark');
    const horn = DEVICE_MODELS.horn;
    const hp = horn.params.parse({});
    expect(horn.word(horn.step!(horn.initial(hp), hp, inputs({ energised: true }), 10), hp)).toBe('sounding');
  });
  it('a photo-eye closes while blocked (or while clear, if dark-operated)', () => {
    const eye = DEVICE_MODELS.photoeye;
    const light = eye.params.parse({});
    const dark = eye.params.parse({ closesWhen: 'clear' });
    const blocked = act(eye.actions.block!(eye.initial(light), light, {}));
    expect(eye.isClosed(blocked, light, 'OUT')).toBe(true);
    expect(eye.isClosed(blocked, dark, 'OUT')).toBe(false);
    expect(eye.word(act(eye.actions.unblock!(blocked, light, {})), light)).toBe('clear');
  });
  it('a limit switch swaps its NO and NC contacts when actuated', () => {
    const ls = DEVICE_MODELS.limit;
    const p = ls.params.parse({});
    const on = act(ls.actions.press!(ls.initial(p), p, {}));
    expect([ls.isClosed(on, p, '13-14'), ls.isClosed(on, p, '21-22')]).toEqual([true, false]);
    expect(ls.word(on, p)).toBe('actuated');
  });
});
