/**
 * Fill for a person on the plan map: deep ink for those expected to hear soonest, fading to pale
 * sand for the last. Lightness changes steadily, so the map also reads in black and white.
 */
const NEAR = [22, 50, 74]; // --rh-ink
const FAR = [236, 228, 214];

export function hopsShade(hops: number | null, lo: number, hi: number): string {
  if (hops === null || !Number.isFinite(hops)) return '#ffffff';
  const t = hi > lo ? Math.min(1, Math.max(0, (hops - lo) / (hi - lo))) : 0;
  const c = NEAR.map((v, i) => Math.round(v + (FAR[i] - v) * t));
  return `rgb(${c[0]}, ${c[1]}, ${c[2]})`;
}
