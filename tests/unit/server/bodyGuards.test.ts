import { describe, expect, it } from 'vitest';
import { findNulCharacter } from '../../../server/http/bodyGuards';
import { documentWithRungs } from '../../api/helpers/fixtures';

describe('findNulCharacter', () => {
  it('finds nothing in a body without U+0000', () => {
    expect(findNulCharacter({ baseVersion: 2, document: documentWithRungs(3), message: 'ok', tags: [null, 1, true] })).toBeNull();
  });

  it('names the place of a NUL in a string nested in objects and arrays', () => {
    const document = documentWithRungs(2);
    const body = { document: { ...document, rungs: [document.rungs[0], { ...document.rungs[1], comment: 'a\u0000b' }] } };
    expect(findNulCharacter(body)).toBe('document.rungs.1.comment');
  });

  it('names the object holding a field name with a NUL, and the body for a bare string', () => {
    expect(findNulCharacter({ outer: { ['k\u0000']: 1 } })).toBe('outer');
    expect(findNulCharacter('\u0000')).toBe('(body)');
  });
});
