/**
 * Bookkeeping of one cascade, shared by both walk kernels: per finished walk, Welford's update of
 * the person's mean and squared deviations (run k of the partial), the hop histogram, capped
 * walks, and the sample path when this run is kept for the replay.
 */
import { growTo, type SimPartial } from './partial';

export interface SampleBuilder {
  readonly run: number;
  readonly people: Int32Array;
  readonly hops: Int32Array;
  readonly capped: Uint8Array;
  readonly truncated: Uint8Array;
  /** Path of walker q: the person, then every position after each hop (at most pathCap entries). */
  readonly paths: number[][];
  readonly pathCap: number;
}

export class CascadeTally {
  private runTotal = 0;
  private hops = 0;
  private cappedWalks = 0;
  private hist: Float64Array;

  constructor(
    private readonly part: SimPartial,
    private readonly k: number,
    readonly sample: SampleBuilder | null,
  ) {
    this.hist = part.histogram;
  }

  /** Walker q (person `start`) took h hops; `reached` is false when the walk was capped. */
  walk(q: number, start: number, h: number, reached: boolean): void {
    const { mean, m2, capped } = this.part;
    if (reached) {
      if (h >= this.hist.length) this.hist = growTo(this.hist, h + 1);
      this.hist[h]++;
    } else {
      capped[start]++;
      this.cappedWalks++;
    }
    const d = h - mean[start];
    mean[start] += d / this.k;
    m2[start] += d * (h - mean[start]);
    this.runTotal += h;
    this.hops += h;
    const s = this.sample;
    if (s) {
      s.hops[q] = h;
      s.capped[q] = reached ? 0 : 1;
      s.truncated[q] = h + 1 > s.pathCap ? 1 : 0;
    }
  }

  /** Writes the run into the partial and returns its total hops. */
  finish(): number {
    this.part.histogram = this.hist;
    this.part.hops += this.hops;
    this.part.cappedWalks += this.cappedWalks;
    return this.runTotal;
  }
}
