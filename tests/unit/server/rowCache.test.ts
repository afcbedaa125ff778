import { describe, expect, it } from 'vitest';
import { RowCache } from '../../../server/db/rowCache';

type Row = { id: string; title: string; nested: { rungs: string[] } };
const row = (id: string, title = 't'): Row => ({ id, title, nested: { rungs: ['r1'] } });

describe('RowCache', () => {
  it('loads a missing row once and serves it from memory after', async () => {
    const cache = new RowCache<Row>(10);
    let loads = 0;
    const load = async () => {
      loads += 1;
      return row('a');
    };
    expect(await cache.read('a', load)).toEqual(row('a'));
    expect(await cache.read('a', load)).toEqual(row('a'));
    expect(loads).toBe(1);
  });

  it('does not remember a row that does not exist', async () => {
    const cache = new RowCache<Row>(10);
    let loads = 0;
    const load = async () => {
      loads += 1;
      return null;
    };
    expect(await cache.read('a', load)).toBeNull();
    expect(await cache.read('a', load)).toBeNull();
    expect(loads).toBe(2);
  });

  it('keeps out a row read before a write that committed while the read was under way', async () => {
    const cache = new RowCache<Row>(10);
    let finishRead: (r: Row) => void = () => undefined;
    const slowRead = cache.read('a', () => new Promise<Row>((resolve) => (finishRead = resolve)));
    cache.drop('a'); // a write committed meanwhile
    finishRead(row('a', 'old'));
    expect((await slowRead)?.title).toBe('old');
    expect(await cache.read('a', async () => row('a', 'new'))).toMatchObject({ title: 'new' });
  });

  it('answers the row a write put, without loading', async () => {
    const cache = new RowCache<Row>(10);
    cache.put('a', row('a', 'written'));
    expect(await cache.read('a', async () => row('a', 'loaded'))).toMatchObject({ title: 'written' });
  });

  it('drops the least recently used row beyond its capacity', async () => {
    const cache = new RowCache<Row>(2);
    cache.put('a', row('a'));
    cache.put('b', row('b'));
    await cache.read('a', async () => null); // a is now the most recently used
    cache.put('c', row('c'));
    expect(cache.size).toBe(2);
    expect(cache.peek('a')).toBeDefined();
    expect(cache.peek('b')).toBeUndefined();
  });

  it('drops by key pattern and clears', () => {
    const cache = new RowCache<Row>(10);
    cache.put('p1#1', row('1'));
    cache.put('p1#2', row('2'));
    cache.put('p2#1', row('3'));
    cache.dropWhere((k) => k.startsWith('p1#'));
    expect(cache.size).toBe(1);
    cache.clear();
    expect(cache.size).toBe(0);
  });

  it('freezes the rows it holds, so no caller can change a shared row', () => {
    const cache = new RowCache<Row>(10);
    const held = cache.put('a', row('a'));
    expect(() => {
      (held as { title: string }).title = 'changed';
    }).toThrow(TypeError);
  });
});
