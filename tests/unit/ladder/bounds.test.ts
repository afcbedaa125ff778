import { describe, expect, it } from 'vitest';
import { checkDocumentBounds } from '@shared/ladder/bounds';
import { parseProgram, parseProgramText } from '@shared/ladder/restore';
import { DOCUMENT_LIMITS } from '@shared/ladder/schema';

const contact = (id: string, extra: Record<string, unknown> = {}) => ({ kind: 'contact', id, variant: 'no', operand: '%IX1', ...extra });
const program = (...networks: unknown[]) => ({
  format: 'rungwright.program',
  version: 1,
  rungs: networks.map((network, i) => ({ id: `r${i + 1}`, network })),
});

/** A rung's root series holding `levels` more series/parallel levels, alternating, around one contact. */
function nested(levels: number): unknown {
  let node: unknown = contact('c0');
  for (let i = levels; i >= 1; i -= 1) node = i % 2 === 1 ? { kind: 'parallel', id: `p${i}`, branches: [node] } : { kind: 'series', id: `s${i}`, items: [node] };
  return { kind: 'series', id: 'root', items: [node] };
}

function refusal(json: unknown): string {
  const result = parseProgram(json);
  if (result.ok) throw new Error('expected the document to be refused');
  return result.error;
}

describe('document limits', () => {
  it('loads a program nested exactly to the depth limit', () => {
    // The root series is level 1, so 31 more levels make 32.
    expect(parseProgram(program(nested(DOCUMENT_LIMITS.depth - 1))).ok).toBe(true);
  });

  it('refuses one level more, naming the rung and where the branch goes too deep', () => {
    const message = refusal(program(series('root0', []), nested(DOCUMENT_LIMITS.depth)));
    expect(message).toMatch(/^rungs\[1\]\.network\.items\[0\]\.branches\[0\]…items\[0\]\.branches\[0\]: /);
    expect(message).toContain('branches nest more than 32 levels deep in rung 2');
    const problem = checkDocumentBounds(program(nested(DOCUMENT_LIMITS.depth)));
    // rungs, 0, network, then items/branches and an index per level below the root.
    expect(problem?.path.slice(0, 5)).toEqual(['rungs', 0, 'network', 'items', 0]);
    expect(problem?.path).toHaveLength(3 + 2 * DOCUMENT_LIMITS.depth);
  });

  it('refuses a document nested far past the limit without overflowing the call stack', () => {
    // 973 levels crashed the schema (and the canvas) before the limit existed.
    for (const levels of [973, 100_000]) expect(refusal(program(nested(levels)))).toContain('more than 32 levels deep');
    const text = `{"format":"rungwright.program","version":1,"rungs":[{"id":"r1","network":${'{"kind":"series","id":"s","items":['.repeat(50_000)}${']}'.repeat(50_000)}}]}`;
    const parsed = parseProgramText(text);
    expect(parsed.ok).toBe(false);
    expect(!parsed.ok && parsed.error).toContain('more than 32 levels deep in rung 1');
  });

  it('refuses a rung with too many elements, and a program with too many in all', () => {
    const wide = { kind: 'series', id: 'root', items: Array.from({ length: DOCUMENT_LIMITS.nodesPerRung }, (_, i) => contact(`c${i}`)) };
    expect(refusal(program(wide))).toBe(`rungs[0].network.items[${DOCUMENT_LIMITS.nodesPerRung - 1}]: rung 1 has more than ${DOCUMENT_LIMITS.nodesPerRung} elements and branches`);
    const rungs = Math.ceil(DOCUMENT_LIMITS.nodesPerProgram / 100) + 1;
    // 99 contacts under each root series: 100 nodes a rung, within the per-rung limit.
    const many = Array.from({ length: rungs }, (_, r) => series(`s${r}`, Array.from({ length: 99 }, (_, i) => contact(`c${r}_${i}`))));
    expect(refusal(program(...many))).toContain(`the program has more than ${DOCUMENT_LIMITS.nodesPerProgram} elements and branches`);
  });

  it('refuses the NUL character in any string or field name, naming the field', () => {
    expect(refusal(program(series('root', [contact('c1', { comment: 'a\u0000b' })])))).toBe(
      'rungs[0].network.items[0].comment: holds the NUL character (U+0000), which cannot be stored',
    );
    expect(refusal({ ...program(), title: '\u0000' })).toBe('title: holds the NUL character (U+0000), which cannot be stored');
    expect(refusal({ ...program(), tags: [{ 'na\u0000me': 'x' }] })).toBe('tags[0]: has a field name holding the NUL character (U+0000)');
  });

  it('leaves documents of the wrong shape to the schema', () => {
    expect(checkDocumentBounds([])).toBeNull();
    expect(checkDocumentBounds({ rungs: 'none' })).toBeNull();
    expect(checkDocumentBounds(program(42, null))).toBeNull();
  });
});

function series(id: string, items: unknown[]): unknown {
  return { kind: 'series', id, items };
}
