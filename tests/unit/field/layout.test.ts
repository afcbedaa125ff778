import { describe, expect, it } from 'vitest';
import { builtInPanel, CONVEYOR_FLA_A, parsePanelLayout, REVERSING_CONVEYOR, REVERSING_CONVEYOR_INPUT } from '@shared/field';

/** The default layout as plain JSON, loosely typed so a test can break it on purpose. */
interface LooseLayout {
  devices: {
    id: string;
    kind: string;
    feeds?: string;
    drivenBy?: string;
    params: { settingA?: unknown; contactors?: string[]; feeders: { contactor: string }[] };
  }[];
  outputCommon: { device: string; contact: string }[];
}

/** A deep copy of the default layout's JSON. */
const layout = (): LooseLayout => JSON.parse(JSON.stringify(REVERSING_CONVEYOR_INPUT)) as LooseLayout;

function errorsOf(json: unknown): string[] {
  const result = parsePanelLayout(json);
  return result.ok ? [] : result.errors;
}

describe('the default panel layout reversing-conveyor', () => {
  const byId = new Map(REVERSING_CONVEYOR.devices.map((d) => [d.id, d]));

  it('wires each device to the address docs/names-and-rules.md gives', () => {
    const feeds = Object.fromEntries(REVERSING_CONVEYOR.devices.filter((d) => d.feeds).map((d) => [d.feeds, `${d.id} ${d.contact ?? ''}`.trim()]));
    expect(feeds).toEqual({
      '%IX1': 'S1',
      '%IX2': 'S2',
      '%IX3': 'S3',
      '%IX4': 'S4 RUN',
      '%IX5': 'B1',
      '%IX6': 'F1 97-98',
      '%IX7': 'K1 13-14',
      '%IX8': 'K2 13-14',
    });
    const driven = Object.fromEntries(REVERSING_CONVEYOR.devices.filter((d) => d.drivenBy).map((d) => [d.drivenBy, d.id]));
    expect(driven).toEqual({ '%QX1': 'K1', '%QX2': 'K2', '%QX3': 'H1', '%QX4': 'P1', '%QX5': 'P2', '%QX6': 'P3' });
  });

  it('has S1 NC red, S2 NO green, S3 NO, a JOG/RUN selector starting at JOG', () => {
    expect(byId.get('S1')).toMatchObject({ kind: 'pushbutton', params: { form: 'NC', colour: 'red' } });
    expect(byId.get('S2')).toMatchObject({ kind: 'pushbutton', params: { form: 'NO', colour: 'green' } });
    expect(byId.get('S3')).toMatchObject({ kind: 'pushbutton', params: { form: 'NO', colour: 'black' } });
    expect(byId.get('S4')).toMatchObject({ kind: 'selector', params: { positions: ['JOG', 'RUN'], initial: 'JOG' } });
  });

  it('runs both commons through the e-stop S0 and both coils through F1 95-96', () => {
    expect(REVERSING_CONVEYOR.inputCommon).toEqual([{ device: 'S0', contact: '11-12' }]);
    expect(REVERSING_CONVEYOR.outputCommon).toEqual([{ device: 'S0', contact: '21-22' }]);
    expect(byId.get('K1')!.through).toEqual([{ device: 'F1', contact: '95-96' }]);
    expect(byId.get('K2')!.through).toEqual([{ device: 'F1', contact: '95-96' }]);
    expect(byId.get('R1')).toMatchObject({ kind: 'interlock', params: { contactors: ['K1', 'K2'] } });
  });

  it('uses M1 1/2 hp 208 V with FLA 2.4 A (NEC Table 430.250, value from memory) and F1 class 10 set to FLA', () => {
    expect(CONVEYOR_FLA_A).toBe(2.4);
    expect(byId.get('M1')).toMatchObject({ kind: 'motor', params: { flaA: 2.4, hp: 0.5, volts: 208 } });
    expect(byId.get('F1')).toMatchObject({ kind: 'overload', params: { settingA: 2.4, tripClass: '10', motor: 'M1' } });
  });

  it('gives the contactors 25 ms pick-up and 15 ms drop-out (typical, from memory)', () => {
    expect(byId.get('K1')!.params).toEqual({ pickUpMs: 25, dropOutMs: 15 });
  });

  it('is found by id among the built-in panels', () => {
    expect(builtInPanel('reversing-conveyor')).toBe(REVERSING_CONVEYOR);
    expect(builtInPanel('toString')).toBeUndefined();
  });

  it('is marked as an invented demo scenario', () => {
    expect(REVERSING_CONVEYOR.title).toContain('demo');
    expect(REVERSING_CONVEYOR.description).toMatch(/Demo scenario, invented/);
  });
});

describe('layout errors are located messages', () => {
  it('names an input out of range', () => {
    const json = layout();
    json.devices[3].feeds = '%IX9';
    expect(errorsOf(json)).toEqual(['devices[3].feeds: %IX9 is out of range: this panel has inputs %IX1..%IX8']);
  });
  it('names an input wired twice, an output on an input, and a lamp fed from an input', () => {
    const json = layout();
    json.devices[2].feeds = '%IX1';
    json.devices[11].drivenBy = '%IX3';
    json.devices[12].feeds = '%IX5';
    expect(errorsOf(json)).toEqual([
      'devices[2].feeds: %IX1 is already wired to S1',
      'devices[11].drivenBy: %IX3 is not an output such as %QX1',
      'devices[12].feeds: P2 (a lamp) has no contact to wire to an input',
    ]);
  });
  it('names an unknown kind with the kinds there are', () => {
    const json = layout();
    json.devices[0].kind = 'relay';
    expect(errorsOf(json)[0]).toBe(
      'devices[0].kind: unknown device kind "relay"; use one of pushbutton, estop, selector, contactor, interlock, overload, lamp, horn, motor, photoeye, limit',
    );
  });
  it('names a missing contact with the contacts the device has', () => {
    const json = layout();
    json.outputCommon = [{ device: 'S0', contact: '13-14' }];
    expect(errorsOf(json)).toEqual(['outputCommon[0].contact: S0 has no contact "13-14"; it has 11-12 (NC), 21-22 (NC)']);
  });
  it('names a duplicate id, a bad id and a bad parameter', () => {
    const json = layout();
    json.devices[2].id = 'S1';
    expect(errorsOf(json)).toContain('devices[2].id: "S1" is used by two devices');
    const bad = layout();
    bad.devices[6].params.settingA = 'lots';
    bad.devices[1].id = 'stop';
    const errors = errorsOf(bad);
    expect(errors.some((e) => e.startsWith('devices[1].id: a device id is a letter code and a number'))).toBe(true);
    expect(errors.some((e) => e.startsWith('devices[6].params.settingA: expected number'))).toBe(true);
  });
  it('names an interlock on something that is not a contactor and a motor fed by a lamp', () => {
    const json = layout();
    json.devices[9].params.contactors = ['K1', 'P1'];
    json.devices[14].params.feeders[1]!.contactor = 'H1';
    expect(errorsOf(json)).toEqual([
      'devices[9].params.contactors[1]: "P1" is a lamp, not a contactor',
      'devices[14].params.feeders[1].contactor: "H1" is a horn, not a contactor',
    ]);
  });
  it('refuses something that is not a layout at all', () => {
    expect(errorsOf(42).length).toBeGreaterThan(0);
    expect(errorsOf({ format: 'rungwright.panel' }).length).toBeGreaterThan(0);
  });
});
