/**
 * Fill for a person on the plan map: deep ink for those expected to hear soonest, fading to pale
 * sand for the last. Lightness changes steadily, so the map also reads in black and white.
 */
type Rgb = [r: number, g: number, b: number];
const NEAR: Rgb = [22, 50, 74]; // --rh-ink
const FAR: Rgb = [236, 228, 214];

export function hopsShade(hops: number | null, lo: number, hi: number): string {
  if (hops === null || !Number.isFinite(hops)) return '#ffffff';
  const t = hi > lo ? Math.min(1, Math.max(0, (hops - lo) / (hi - lo))) : 0;
  const mix = (near: number, far: number) => Math.round(near + (far - near) * t);
  return `rgb(${mix(NEAR[0], FAR[0])}, ${mix(NEAR[1], FAR[1])}, ${mix(NEAR[2], FAR[2])})`;
}
