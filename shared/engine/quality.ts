/**
 * Quality rank (engine.md section 3): r(A) = (F_max - total(A)) / (F_max - F_min), where
 * F_max is the worst single-starter total and F_min = n - c is the cover bound (c = cover size;
 * for k >= c the bound is n - k). Both carry the laziness factor 1 / (1 - a). Clamped to [0, 1].
 */
export function coverBound(n: number, k: number, scale = 1): number {
  return (n - k) * scale;
}

export function qualityRank(total: number, worst: number, n: number, k: number, coverSize: number, scale = 1): number {
  const best = coverBound(n, Math.max(k, coverSize), scale);
  if (!Number.isFinite(total)) return 0;
  if (!(worst - best > 0)) return 1;
  const r = (worst - total) / (worst - best);
  return Math.min(1, Math.max(0, r));
}

/**
 * Share of the possible saving over the best single starter achieved by a plan:
 * (single - total) / (single - lowerBound), clamped to [0, 1]. 1 means the plan is proven best
 * of its size; a plan far from its proven bound reads lower. The quality rank above measures
 * against the worst single starter, so every reasonable plan of a given size reads close to 1
 * there; this figure spreads them out (0 = no better than one well-chosen person).
 */
export function gainShare(total: number, lowerBound: number, single: number | undefined): number {
  if (single === undefined || !Number.isFinite(total)) return 0;
  if (!(single - lowerBound > 0)) return 1;
  return Math.min(1, Math.max(0, (single - total) / (single - lowerBound)));
}
