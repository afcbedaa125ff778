import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { IdSet } from '@shared/ladder/idSet';
import { IdSchema } from '@shared/ladder/schema';
import { SCHEMA_LIMITS } from '@shared/ladder/wellFormed';

describe('IdSet', () => {
  it('takes each id once, also after growing past its first table', () => {
    const set = new IdSet(SCHEMA_LIMITS.id);
    const ids = Array.from({ length: 5000 }, (_, i) => `${'espbr'[i % 5]}${i}`);
    expect(ids.every((id) => set.addNew(id))).toBe(true);
    expect(ids.filter((id) => set.addNew(id))).toEqual([]);
    // Near ids (one character changed, some already taken) against a JavaScript Set.
    const reference = new Set(ids);
    for (const id of ids.slice(0, 1000)) {
      const near = `${id.slice(0, -1)}_`;
      expect(set.addNew(near)).toBe(!reference.has(near));
      reference.add(near);
    }
    expect(set.addNew('E0')).toBe(true);
  });

  it('accepts exactly the ids the schema accepts', () => {
    const text = fc.string({ unit: fc.constantFrom('a', 'Z', '0', '9', '_', '-', ' ', '.', 'é', '\u0000', '/', '`', '{', '@', '['), maxLength: 70 });
    fc.assert(
      fc.property(fc.oneof(text, fc.constant('x'.repeat(64)), fc.constant('x'.repeat(65))), (id) => {
        expect(new IdSet(SCHEMA_LIMITS.id).addNew(id)).toBe(IdSchema.safeParse(id).success);
      }),
      { numRuns: 2000 },
    );
  });

  it('refuses what is not a string', () => {
    const set = new IdSet(SCHEMA_LIMITS.id);
    for (const value of [undefined, null, 3, ['a'], { id: 'a' }]) expect(set.addNew(value)).toBe(false);
  });
});
