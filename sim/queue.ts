/**
 * A binary-heap event queue keyed by (time, sequence). Contract: `pop` returns the entry with the smallest
 * time; equal times come out in ascending sequence, so a run never depends on insertion accidents. The
 * caller chooses the sequence (the engine uses the crew index, which is MODEL.md's tie rule). Storage is
 * typed arrays that grow by doubling, so pushing and popping allocate nothing in the steady state.
 */

export class EventQueue {
  private times: Float64Array;
  private seqs: Float64Array;
  private payloads: Int32Array;
  private n = 0;

  constructor(capacity = 16) {
    this.times = new Float64Array(capacity);
    this.seqs = new Float64Array(capacity);
    this.payloads = new Int32Array(capacity);
  }

  get size(): number {
    return this.n;
  }

  clear(): void {
    this.n = 0;
  }

  push(time: number, seq: number, payload: number): void {
    if (this.n === this.times.length) this.grow();
    let i = this.n++;
    // Sift up: move parents down until the new key is not smaller than its parent's.
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!this.less(time, seq, this.times[p], this.seqs[p])) break;
      this.times[i] = this.times[p];
      this.seqs[i] = this.seqs[p];
      this.payloads[i] = this.payloads[p];
      i = p;
    }
    this.times[i] = time;
    this.seqs[i] = seq;
    this.payloads[i] = payload;
  }

  /** Time of the smallest entry (Infinity when empty). */
  peekTime(): number {
    return this.n > 0 ? this.times[0] : Infinity;
  }

  peekSeq(): number {
    return this.n > 0 ? this.seqs[0] : NaN;
  }

  /** Removes the smallest entry and returns its payload; `lastTime`/`lastSeq` hold its key. */
  pop(): number {
    if (this.n === 0) emptyPop();
    const payload = this.payloads[0];
    this.lastTime = this.times[0];
    this.lastSeq = this.seqs[0];
    const last = --this.n;
    if (last > 0) {
      const t = this.times[last];
      const s = this.seqs[last];
      const pl = this.payloads[last];
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= last) break;
        const r = l + 1;
        const c = r < last && this.less(this.times[r], this.seqs[r], this.times[l], this.seqs[l]) ? r : l;
        if (!this.less(this.times[c], this.seqs[c], t, s)) break;
        this.times[i] = this.times[c];
        this.seqs[i] = this.seqs[c];
        this.payloads[i] = this.payloads[c];
        i = c;
      }
      this.times[i] = t;
      this.seqs[i] = s;
      this.payloads[i] = pl;
    }
    return payload;
  }

  lastTime = NaN;
  lastSeq = NaN;

  private less(t1: number, s1: number, t2: number, s2: number): boolean {
    return t1 < t2 || (t1 === t2 && s1 < s2);
  }

  private grow(): void {
    const cap = this.times.length * 2;
    const t = new Float64Array(cap);
    const s = new Float64Array(cap);
    const p = new Int32Array(cap);
    t.set(this.times);
    s.set(this.seqs);
    p.set(this.payloads);
    this.times = t;
    this.seqs = s;
    this.payloads = p;
  }
}

// Out of line: the message's code would count against V8's inlining budget of every caller of `pop`.
function emptyPop(): never {
  throw new Error("pop from an empty EventQueue");
}
