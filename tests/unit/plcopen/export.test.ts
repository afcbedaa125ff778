import { describe, expect, it } from 'vitest';
import { XMLValidator } from 'fast-xml-parser';
import { exportPlcopen, importPlcopen } from '@shared/ladder/plcopen';
import type { NetworkNode, Program } from '@shared/ladder/schema';
import { comparable, createBuilders, program } from './programs';

/** Power at the end of a network of NO contacts on %IX1..%IX3, for all eight input states. */
function truthTable(network: NetworkNode): boolean[] {
  const evaluate = (node: NetworkNode, inputs: Record<string, boolean>): boolean => {
    if (node.kind === 'series') return node.items.every((item) => evaluate(item, inputs));
    if (node.kind === 'parallel') return node.branches.some((branch) => evaluate(branch, inputs));
    if (node.kind === 'contact') return inputs[node.operand] ?? false;
    return true;
  };
  return Array.from({ length: 8 }, (_, n) =>
    evaluate(network, { '%IX1': (n & 1) !== 0, '%IX2': (n & 2) !== 0, '%IX3': (n & 4) !== 0 }),
  );
}

function back(p: Program): Program {
  const result = importPlcopen(exportPlcopen(p));
  if (!result.ok) throw new Error(result.error);
  return result.value.program;
}

describe('exporting to PLCopen TC6 XML', () => {
  it('writes creationDateTime from the now option, and a fixed date without one (shared code reads no clock)', () => {
    const p = program([]);
    expect(exportPlcopen(p, { now: '2025-02-03T04:05:06.789Z' })).toContain('creationDateTime="2025-02-03T04:05:06.789Z"');
    expect(exportPlcopen(p)).toContain('creationDateTime="1970-01-01T00:00:00Z"');
  });

  it('throws for a now that is not an ISO date-time, a programming mistake', () => {
    expect(() => exportPlcopen(program([]), { now: 'yesterday' })).toThrow(RangeError);
  });

  it('drops characters XML cannot carry and writes a line end as a line feed, so the file always parses', () => {
    const b = createBuilders();
    const p = program([b.rung('bell\u0007 here\r\nnext', b.no('%IX1'), b.coil('%QX1'))], [], 'nul\u0000title', 'a\rb');
    const xml = exportPlcopen(p);
    expect(XMLValidator.validate(xml)).toBe(true);
    const imported = back(p);
    expect(imported.rungs[0]?.comment).toBe('bell here\nnext');
    expect(imported.title).toBe('nultitle');
    expect(imported.description).toBe('a\nb');
  });

  it('writes a line break in the title as a space, as XML readers normalise attributes', () => {
    expect(back(program([], [], 'two\nlines')).title).toBe('two lines');
  });

  it('names the declaration of an untagged memory bit so it clashes with no tag', () => {
    const b = createBuilders();
    const p = program([b.rung('', b.no('%MX3'), b.coil('MX3'))], [{ name: 'MX3', address: '%QX1', comment: '' }]);
    const xml = exportPlcopen(p);
    expect(xml).toContain('<variable name="MX3_2" address="%MX3">');
    expect(back(p).tags).toEqual(p.tags);
  });

  it('declares each block instance once, with the type of its first use', () => {
    const b = createBuilders();
    const xml = exportPlcopen(program([b.rung('', b.no('%IX1'), b.block('TON', 'T1', { PT: 'T#1s' })), b.rung('', b.no('%IX2'), b.block('TON', 'T1', { PT: 'T#2s' }))]));
    expect(xml.match(/<variable name="T1">/g)).toHaveLength(1);
    expect(xml).toContain('<derived name="TON"/>');
  });

  it('gives every rung its own pair of rails, stacked top to bottom without overlap', () => {
    const b = createBuilders();
    const xml = exportPlcopen(program([b.rung('a', b.no('%IX1'), b.coil('%QX1')), b.rung('', b.parallel(b.no('%IX2'), b.no('%IX3')), b.coil('%QX2'))]));
    const rails = [...xml.matchAll(/<leftPowerRail localId="\d+" height="(\d+)"[^>]*>\s*<position x="0" y="(\d+)"\/>/g)].map((m) => ({ height: Number(m[1]), y: Number(m[2]) }));
    expect(rails).toHaveLength(2);
    expect(rails[1]!.y).toBeGreaterThanOrEqual(rails[0]!.y + rails[0]!.height);
    expect(rails[1]!.height).toBe(2 * rails[0]!.height);
  });

  it('does not write a block input that is not one of its formal parameters', () => {
    const b = createBuilders();
    const xml = exportPlcopen(program([b.rung('', b.no('%IX1'), b.block('TON', 'T1', { PT: 'T#1s', XYZ: '%IX2' }))]));
    expect(xml).not.toContain('XYZ');
  });
});

describe('empty branches (a wire across, which validation reports)', () => {
  it('keeps an empty branch around a contact in the middle of a rung', () => {
    const b = createBuilders();
    const p = program([b.rung('', b.no('%IX1'), b.parallel(b.no('%IX2'), b.series()), b.coil('%QX1'))]);
    expect(comparable(back(p))).toEqual(comparable(p));
  });

  it('keeps an empty branch across a whole rung, its rails joined', () => {
    const b = createBuilders();
    const p = program([b.rung('', b.parallel(b.no('%IX2'), b.series())), b.rung('', b.no('%IX3'), b.coil('%QX1'))]);
    expect(comparable(back(p))).toEqual(comparable(p));
  });

  it('keeps the meaning, not the shape, of empty branches nested where an OR join cannot tell them apart', () => {
    // P[ S[ P[a, -], P[c, -] ], e, - ]: TC6 lists feeds, not wires, so the outer empty branch and
    // the feed the inner ones pass on look alike. What comes back must compute the same function.
    const b = createBuilders();
    const p = program([
      b.rung('', b.parallel(b.series(b.parallel(b.no('%IX1'), b.series()), b.parallel(b.no('%IX2'), b.series())), b.no('%IX3'), b.series()), b.coil('%QX1')),
      b.rung('', b.parallel(b.series(b.parallel(b.no('%IX1'), b.series()), b.no('%IX2')), b.no('%IX3')), b.coil('%QX2')),
    ]);
    const imported = back(p);
    for (const [index, rung] of p.rungs.entries()) {
      expect(truthTable(imported.rungs[index]!.network), `rung ${index + 1}`).toEqual(truthTable(rung.network));
    }
  });
});
