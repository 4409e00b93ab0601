/**
 * A growable list of kept indices backed by a Uint32Array (no object per sample).
 * Starts small and doubles, so a method that keeps 5 % of 10M samples never holds a
 * second 10M-entry array.
 */
export class IndexBuffer {
  private data: Uint32Array;
  length = 0;

  constructor(expected = 1024) {
    this.data = new Uint32Array(Math.max(16, expected));
  }

  push(i: number): void {
    if (this.length === this.data.length) this.grow();
    this.data[this.length++] = i;
  }

  /** The last index pushed, or −1 when empty. */
  last(): number {
    return this.length === 0 ? -1 : this.data[this.length - 1];
  }

  /** A right-sized copy of the indices pushed so far. */
  toArray(): Uint32Array {
    return this.data.slice(0, this.length);
  }

  private grow(): void {
    const next = new Uint32Array(this.data.length * 2);
    next.set(this.data);
    this.data = next;
  }
}
