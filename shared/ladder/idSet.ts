/**
 * The set of ids `isParsedProgram` has seen, checking each id's spelling on the way in.
 *
 * Why not a `Set<string>`: a 1,000-rung program has 14,000–19,000 ids, and growing a JavaScript
 * `Set` to that size cost about 170 ns an id in V8 (2.5–5 ms of a compile on this machine), more
 * than the rest of the well-formedness walk. This open-addressing table of indices into the ids
 * themselves costs a tenth of that. One pass over an id's characters both hashes it and checks it
 * against the schema's id pattern (`IdSchema`: 1 to `maxLength` of `A-Z a-z 0-9 _ -`), which no
 * regex then has to do again. Two ids are the same only when their strings are equal (a shared hash is not enough).
 */

/** True for a character the id pattern allows: `A-Z`, `a-z`, `0-9`, `_`, `-`. */
function isIdChar(c: number): boolean {
  return (c >= 97 && c <= 122) || (c >= 65 && c <= 90) || (c >= 48 && c <= 57) || c === 95 || c === 45;
}

export class IdSet {
  private ids: string[] = [];
  /** Index into `ids` + 1 per slot, 0 for an empty slot; its length is a power of two, at least twice the ids. */
  private slots: Int32Array;

  /**
   * `maxLength`: the longest id allowed; `expected`: about how many ids will come (the table is
   * sized for them at once: growing it rehashes every id so far).
   */
  constructor(
    private readonly maxLength: number,
    expected = 256,
  ) {
    let size = 1024;
    while (size < 2 * expected && size < 1 << 20) size *= 2;
    this.slots = new Int32Array(size);
  }

  /**
   * Add `value` when it is a well-formed id not yet in the set; false (and nothing added) when it
   * is not a string, not well formed, or already there.
   */
  addNew(value: unknown): boolean {
    if (typeof value !== 'string' || value.length === 0 || value.length > this.maxLength) return false;
    // FNV-1a over the UTF-16 code units, checking each against the pattern.
    let hash = 0x811c9dc5;
    for (let i = 0; i < value.length; i += 1) {
      const c = value.charCodeAt(i);
      if (!isIdChar(c)) return false;
      hash = Math.imul(hash ^ c, 0x01000193);
    }
    const { slots, ids } = this;
    const mask = slots.length - 1;
    let at = hash & mask;
    for (let held = slots[at]!; held !== 0; held = slots[at]!) {
      if (ids[held - 1] === value) return false;
      at = (at + 1) & mask;
    }
    ids.push(value);
    slots[at] = ids.length;
    if (ids.length * 2 > slots.length) this.grow();
    return true;
  }

  private grow(): void {
    const { ids } = this;
    const slots = new Int32Array(this.slots.length * 2);
    const mask = slots.length - 1;
    for (let k = 0; k < ids.length; k += 1) {
      const value = ids[k]!;
      let hash = 0x811c9dc5;
      for (let i = 0; i < value.length; i += 1) hash = Math.imul(hash ^ value.charCodeAt(i), 0x01000193);
      let at = hash & mask;
      while (slots[at] !== 0) at = (at + 1) & mask;
      slots[at] = k + 1;
    }
    this.slots = slots;
  }
}
