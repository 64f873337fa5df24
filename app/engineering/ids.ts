// Owns the numbering of string ids (nodes, segments, outlets, mixing points) for the network model: each id
// gets the next number the first time it is added. A Map would do for a small network, but past about 4,000
// entries V8 puts its table among the large objects, which come from fresh memory pages on every solve; for a
// network of thousands of outlets those page faults cost more than the whole solve. Here the table is a typed
// array, outside the JS heap, probed linearly from an FNV-1a hash of the id's UTF-16 code units.

const EMPTY = 0;

export class IdTable {
  /** Every id added, by number. */
  readonly ids: string[] = [];
  /** number + 1 of the id in each slot; EMPTY where there is none. Never more than half full. */
  private slots: Int32Array;
  private mask: number;

  /** `expected` sizes the table so that as many ids go in without it growing. */
  constructor(expected = 8) {
    let capacity = 16;
    while (capacity < 2 * expected) capacity *= 2;
    this.slots = new Int32Array(capacity);
    this.mask = capacity - 1;
  }

  get size(): number {
    return this.ids.length;
  }

  /** The id's number, or -1 when it was never added (or is not a string). */
  get(id: unknown): number {
    if (typeof id !== "string") return -1;
    const { slots, mask, ids } = this;
    for (let s = hash(id) & mask; ; s = (s + 1) & mask) {
      const entry = slots[s];
      if (entry === EMPTY) return -1;
      if (ids[entry - 1] === id) return entry - 1;
    }
  }

  /** The id's number, numbering it first if it is new. */
  add(id: string): number {
    const { slots, mask, ids } = this;
    let s = hash(id) & mask;
    for (; slots[s] !== EMPTY; s = (s + 1) & mask) {
      if (ids[slots[s] - 1] === id) return slots[s] - 1;
    }
    const number = ids.length;
    ids.push(id);
    slots[s] = number + 1;
    if (2 * ids.length > slots.length) this.grow();
    return number;
  }

  private grow(): void {
    const slots = new Int32Array(this.slots.length * 2);
    const mask = slots.length - 1;
    for (let number = 0; number < this.ids.length; number++) {
      let s = hash(this.ids[number]) & mask;
      while (slots[s] !== EMPTY) s = (s + 1) & mask;
      slots[s] = number + 1;
    }
    this.slots = slots;
    this.mask = mask;
  }
}

function hash(id: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < id.length; i++) h = Math.imul(h ^ id.charCodeAt(i), 0x01000193);
  return h;
}
