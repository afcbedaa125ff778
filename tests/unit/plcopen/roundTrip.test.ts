import { describe, expect, it } from 'vitest';
import { exportPlcopen, importPlcopen } from '@shared/ladder/plcopen';
import type { Program } from '@shared/ladder/schema';
import { comparable, createBuilders, program } from './programs';

function roundTrip(p: Program): { program: Program; warnings: string[] } {
  const result = importPlcopen(exportPlcopen(p, { now: '2025-03-04T05:06:07Z' }));
  if (!result.ok) throw new Error(`import failed: ${result.error}`);
  return result.value;
}

/** Demo data: the Larch Hollow Timber Co. reversing conveyor (invented scenario, docs/names-and-rules.md). */
function reversingConveyor(): Program {
  const b = createBuilders();
  return program(
    [
      b.rung(
        'Forward: three-wire start/stop with seal-in, interlocked with reverse',
        b.nc('F1_trip'),
        b.no('S1_stop'),
        b.parallel(b.no('S2_fwd'), b.no('%QX1')),
        b.nc('%QX2'),
        b.coil('%QX1'),
      ),
      b.rung(
        'Reverse',
        b.nc('F1_trip'),
        b.no('S1_stop'),
        b.parallel(b.no('S3_rev'), b.no('%QX2')),
        b.nc('%QX1'),
        b.coil('%QX2'),
      ),
      b.rung('Horn sounds for 2 s before the belt moves', b.parallel(b.no('%QX1'), b.no('%QX2')), b.block('TP', 'T1', { PT: 'T#2s' }), b.coil('%QX3')),
      b.rung('', b.contact('rising', '%IX5'), b.block('CTU', 'C1', { R: '%IX4', PV: '10' }), b.parallel(b.coil('%QX6'), b.coil('%MX10', 'set'))),
      b.rung('Lamps', b.parallel(b.no('%QX1'), b.no('%QX2')), b.parallel(b.coil('%QX4'), b.coil('%QX5', 'negated'))),
      b.rung('Latch cleared by the stop button', b.contact('falling', 'S1_stop'), b.coil('%MX10', 'reset')),
    ],
    [
      { name: 'S1_stop', address: '%IX1', comment: 'S1 stop, red, NC' },
      { name: 'S2_fwd', address: '%IX2', comment: 'S2 forward, green' },
      { name: 'S3_rev', address: '%IX3', comment: '' },
      { name: 'F1_trip', address: '%IX6', comment: 'F1 97-98 closes on trip' },
    ],
    'Larch Hollow reversing conveyor (demo)',
    'Demo program for the reversing-conveyor panel.\nInvented data.',
  );
}

describe('PLCopen round trip on hand-written programs', () => {
  it('gives back the reversing conveyor demo with the same rungs, ids, comments and tags', () => {
    const original = reversingConveyor();
    const back = roundTrip(original);
    expect(comparable(back.program)).toEqual(comparable(original));
    expect(back.warnings).toEqual([]);
  });

  it('keeps an empty program empty', () => {
    const original = program([], [], 'Nothing yet');
    expect(comparable(roundTrip(original).program)).toEqual(comparable(original));
  });

  it('keeps an empty rung between two others in its place', () => {
    const b = createBuilders();
    const original = program([b.rung('first', b.no('%IX1'), b.coil('%QX1')), b.rung(''), b.rung('third', b.no('%IX2'), b.coil('%QX2'))]);
    expect(comparable(roundTrip(original).program)).toEqual(comparable(original));
  });

  it('keeps a block that ends a rung with no coil after it', () => {
    const b = createBuilders();
    const original = program([b.rung('', b.no('%IX1'), b.block('TON', 'T1', { PT: 'T#5s' }))]);
    expect(comparable(roundTrip(original).program)).toEqual(comparable(original));
  });

  it('keeps every block type with its operand inputs, including an input left empty', () => {
    const b = createBuilders();
    const original = program([
      b.rung('', b.no('%IX1'), b.block('TON', 'T1', { PT: 'T#1m30s' }), b.coil('%QX1')),
      b.rung('', b.no('%IX1'), b.block('TOF', 'T2', { PT: '' }), b.coil('%QX2')),
      b.rung('', b.no('%IX1'), b.block('TP', 'T3', { PT: 'TIME#1.5s' }), b.coil('%QX3')),
      b.rung('', b.no('%IX2'), b.block('CTU', 'C1', { R: '%IX3', PV: '3' }), b.coil('%QX4')),
      b.rung('', b.no('%IX2'), b.block('CTD', 'C2', { LD: 'C1.Q', PV: '2' }), b.coil('%QX5')),
      b.rung('', b.no('%IX2'), b.block('CTUD', 'C3', { CD: '%IX4', R: '%MX1', LD: 'FALSE', PV: '5' }), b.coil('%QX6')),
      b.rung('', b.no('%IX5'), b.block('R_TRIG', 'E1'), b.coil('%MX2')),
      b.rung('', b.no('%IX5'), b.block('F_TRIG', 'E2'), b.coil('%MX3')),
      b.rung('', b.no('%IX6'), b.block('SR', 'L1', { R: '%IX7' }), b.coil('%MX4')),
      b.rung('', b.no('%IX6'), b.block('RS', 'L2', { R1: '%IX8' }), b.coil('%MX5')),
    ]);
    expect(comparable(roundTrip(original).program)).toEqual(comparable(original));
  });

  it('keeps two blocks in series and a block inside a parallel branch', () => {
    const b = createBuilders();
    const original = program([
      b.rung(
        '',
        b.no('%IX1'),
        b.block('TON', 'T1', { PT: 'T#1s' }),
        b.block('R_TRIG', 'E1'),
        b.parallel(b.series(b.no('%IX2'), b.block('TP', 'T2', { PT: 'T#3s' })), b.no('%IX3')),
        b.coil('%QX1'),
      ),
    ]);
    expect(comparable(roundTrip(original).program)).toEqual(comparable(original));
  });

  it('keeps parallels nested in parallels and parallels straight after parallels', () => {
    const b = createBuilders();
    const original = program([
      b.rung(
        '',
        b.parallel(b.series(b.no('%IX1'), b.parallel(b.no('%IX2'), b.nc('%IX3'))), b.series(b.nc('%IX4'), b.no('%IX5'))),
        b.parallel(b.no('%IX6'), b.no('%IX7')),
        b.parallel(b.coil('%QX1'), b.series(b.no('%IX8'), b.coil('%QX2')), b.coil('%QX3', 'set')),
      ),
    ]);
    expect(comparable(roundTrip(original).program)).toEqual(comparable(original));
  });

  it('keeps element comments, tag comments with line breaks and markup characters', () => {
    const b = createBuilders();
    const contact = { ...b.no('Start'), comment: 'press <here> & "hold"' };
    const coil = { ...b.coil('%QX1'), comment: '' };
    const original = program(
      [b.rung("K1's rung\nsecond line\n\nafter a blank line", contact, coil)],
      [{ name: 'Start', address: '%IX2', comment: "tag & 'comment' <b>" }],
      'Title with "quotes" & <angles>',
      '  leading spaces kept\nand a second line  ',
    );
    expect(comparable(roundTrip(original).program)).toEqual(comparable(original));
  });

  it('keeps a memory bit used without a tag untagged, and a tag on another memory bit a tag', () => {
    const b = createBuilders();
    const original = program(
      [b.rung('', b.no('%MX7'), b.no('Run'), b.coil('%MX8'))],
      [{ name: 'Run', address: '%MX1', comment: '' }],
    );
    const back = roundTrip(original);
    expect(back.program.tags).toEqual(original.tags);
    expect(comparable(back.program)).toEqual(comparable(original));
  });

  it('keeps half-drawn elements with empty operands and an empty instance name', () => {
    const b = createBuilders();
    const original = program([b.rung('', b.no(''), b.block('TON', '', { PT: 'T#1s' }), b.coil(''))]);
    expect(comparable(roundTrip(original).program)).toEqual(comparable(original));
  });

  it('flattens a series written inside a series, which means the same', () => {
    const b = createBuilders();
    const nested = program([b.rung('', b.no('%IX1'), b.series(b.no('%IX2'), b.no('%IX3')), b.coil('%QX1'))]);
    const back = roundTrip(nested).program;
    const items = back.rungs[0]?.network.items ?? [];
    expect(items.map((n) => (n.kind === 'contact' || n.kind === 'coil' ? n.operand : n.kind))).toEqual(['%IX1', '%IX2', '%IX3', '%QX1']);
  });

  it('gives fresh, unique ids where a file carries the same Rungwright id twice', () => {
    const b = createBuilders();
    const first = b.no('%IX1');
    const original = program([b.rung('', first, { ...b.no('%IX2'), id: first.id }, b.coil('%QX1'))]);
    const back = roundTrip(original).program;
    const ids = (back.rungs[0]?.network.items ?? []).map((n) => n.id);
    expect(new Set(ids).size).toBe(ids.length);
    expect(ids[0]).toBe(first.id);
  });
});
