/**
 * The map's name labels: the shipped font (Source Sans 3, self-hosted from @fontsource), and
 * their measured width, so the labeller knows how much room each name takes.
 */
export const LABEL_FONT = { family: "'Source Sans 3', sans-serif", size: 11 };

let ctx: CanvasRenderingContext2D | null = null;
const widths = new Map<string, number>();

if (typeof document !== 'undefined') {
  // Widths measured before the font arrived came from a fallback font: measure again.
  void document.fonts?.ready.then(() => widths.clear());
}

export function labelWidth(text: string): number {
  const known = widths.get(text);
  if (known !== undefined) return known;
  ctx ??= document.createElement('canvas').getContext('2d');
  let w = text.length * LABEL_FONT.size * 0.52;
  if (ctx) {
    ctx.font = `${LABEL_FONT.size}px ${LABEL_FONT.family}`;
    w = ctx.measureText(text).width;
  }
  // The white halo drawn behind each name (stroke 3px) widens it a little.
  w = Math.ceil(w + 3);
  widths.set(text, w);
  return w;
}
