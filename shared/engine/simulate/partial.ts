/**
 * Mergeable accumulators of a rehearsal. Per person: Welford's running mean and sum of squared
 * deviations (Welford 1962, "Note on a method for calculating corrected sums of squares and
 * products"); partials over disjoint run ranges merge with the pairwise update of Chan, Golub
 * and LeVeque 1979 ("Updating formulae and a pairwise algorithm for computing sample variances").
 * Merging always folds in run order, so the same run ranges give bit-identical results
 * whichever worker computed them. Histogram and counts are integers and merge exactly.
 */

export interface SampleCascade {
  /** Run index of this cascade. */
  readonly run: number;
  /** The people who walked (not briefed, able to reach a starter), in input order. */
  readonly people: Int32Array;
  /** Hops each walk took (the cap for capped walks). */
  readonly hops: Int32Array;
  readonly capped: Uint8Array;
  /** Walk of people[k] is path[pathStart[k] .. pathStart[k+1]): the person, every hop, ending on the starter reached. */
  readonly pathStart: Int32Array;
  readonly path: Int32Array;
  /** 1 when the stored path was cut at the sample path cap (hops still counts the whole walk). */
  readonly truncated: Uint8Array;
}

export interface SimPartial {
  readonly kind: 'sim-partial';
  readonly n: number;
  readonly runFrom: number;
  readonly runTo: number;
  /** Per person (0 for starters and people who cannot reach a starter). */
  readonly mean: Float64Array;
  readonly m2: Float64Array;
  readonly capped: Float64Array;
  /** Welford over the per-run total hops of all walks (for the room's standard error). */
  totalMean: number;
  totalM2: number;
  /** Hops simulated, capped walks included. */
  hops: number;
  cappedWalks: number;
  /** histogram[t] = walks that reached a starter at hop t (capped walks are not in it). */
  histogram: Float64Array;
  readonly samples: SampleCascade[];
}

export function emptyPartial(n: number, runFrom: number, runTo: number): SimPartial {
  return {
    kind: 'sim-partial',
    n,
    runFrom,
    runTo,
    mean: new Float64Array(n),
    m2: new Float64Array(n),
    capped: new Float64Array(n),
    totalMean: 0,
    totalM2: 0,
    hops: 0,
    cappedWalks: 0,
    histogram: new Float64Array(64),
    samples: [],
  };
}

export function runsOf(p: SimPartial): number {
  return p.runTo - p.runFrom;
}

/** Merges partials of disjoint, contiguous run ranges (in any order given; folded in run order). */
export function mergePartials(parts: readonly SimPartial[]): SimPartial {
  if (parts.length === 0) throw new Error('mergePartials needs at least one partial');
  const sorted = [...parts].sort((a, b) => a.runFrom - b.runFrom);
  const n = sorted[0].n;
  for (let k = 1; k < sorted.length; k++) {
    if (sorted[k].n !== n) throw new Error('mergePartials: partials come from rooms of different sizes');
    if (sorted[k].runFrom !== sorted[k - 1].runTo) {
      throw new Error(`mergePartials: runs ${sorted[k - 1].runTo}..${sorted[k].runFrom} are missing or overlap`);
    }
  }
  const first = sorted[0];
  const out = emptyPartial(n, first.runFrom, first.runFrom);
  let runs = 0;
  const mean = out.mean;
  const m2 = out.m2;
  let histogram = out.histogram;
  for (const p of sorted) {
    const nb = runsOf(p);
    if (nb === 0) continue;
    const na = runs;
    const nt = na + nb;
    const fb = nb / nt;
    const cross = (na * nb) / nt;
    for (let i = 0; i < n; i++) {
      const d = p.mean[i] - mean[i];
      mean[i] += d * fb;
      m2[i] += p.m2[i] + d * d * cross;
      out.capped[i] += p.capped[i];
    }
    const dt = p.totalMean - out.totalMean;
    out.totalMean += dt * fb;
    out.totalM2 += p.totalM2 + dt * dt * cross;
    out.hops += p.hops;
    out.cappedWalks += p.cappedWalks;
    histogram = addHistogram(histogram, p.histogram);
    out.samples.push(...p.samples);
    runs = nt;
  }
  return { ...out, runTo: first.runFrom + runs, histogram };
}

export function addHistogram(a: Float64Array, b: Float64Array): Float64Array {
  const out = b.length > a.length ? growTo(a, b.length) : a;
  for (let t = 0; t < b.length; t++) out[t] += b[t];
  return out;
}

export function growTo(a: Float64Array, length: number): Float64Array {
  let size = Math.max(a.length, 1);
  while (size < length) size *= 2;
  if (size === a.length) return a;
  const out = new Float64Array(size);
  out.set(a);
  return out;
}
