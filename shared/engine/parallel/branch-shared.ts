/**
 * The state threads of one branch and bound share over a SharedArrayBuffer: the next piece to
 * take, a stop flag, the best raw total (updated under a spin lock), and per thread its pending
 * bound, closed k-sets and nodes (read by the main thread for progress). Node and browser safe.
 */
import type { SearchLink } from '../plan-exhaustive';

const INTS = 4; // next piece, stop flag, lock, spare

export class SharedSearchState {
  readonly ctrl: Int32Array;
  readonly vals: Float64Array;

  constructor(
    readonly sab: SharedArrayBuffer,
    readonly threads: number,
  ) {
    this.ctrl = new Int32Array(sab, 0, INTS);
    this.vals = new Float64Array(sab, INTS * 4, 1 + 3 * threads);
  }

  static create(threads: number, bestRaw: number, firstPiece = 0): SharedSearchState {
    const s = new SharedSearchState(new SharedArrayBuffer(INTS * 4 + 8 * (1 + 3 * threads)), threads);
    s.vals[0] = bestRaw;
    s.ctrl[0] = firstPiece;
    return s;
  }

  take(count: number): number {
    const q = Atomics.add(this.ctrl, 0, 1);
    return q < count ? q : -1;
  }

  taken(): number {
    return Atomics.load(this.ctrl, 0);
  }

  requestStop(): void {
    Atomics.store(this.ctrl, 1, 1);
  }

  stopRequested(): boolean {
    return Atomics.load(this.ctrl, 1) === 1;
  }

  best(): number {
    return this.vals[0];
  }

  offer(raw: number): void {
    while (Atomics.compareExchange(this.ctrl, 2, 0, 1) !== 0);
    if (raw < this.vals[0]) this.vals[0] = raw;
    Atomics.store(this.ctrl, 2, 0);
  }

  /** [pending bound, closed k-sets, nodes] of thread `slot`. */
  slot(slot: number): [number, number, number] {
    const at = 1 + 3 * slot;
    return [this.vals[at], this.vals[at + 1], this.vals[at + 2]];
  }

  link(slot: number): SearchLink {
    const at = 1 + 3 * slot;
    this.vals[at] = -Infinity;
    return {
      best: () => this.best(),
      offer: (raw) => this.offer(raw),
      publish: (pending, closed, nodes) => {
        this.vals[at] = pending;
        this.vals[at + 1] = closed;
        this.vals[at + 2] = nodes;
      },
    };
  }
}
