import { type ShapeName, shapePath } from './group-style';

/**
 * A group's shape as a list of corners, read from the same SVG path the small-room map draws
 * (group-style.ts), so the overview's shapes are the small map's shapes. Null for the circle,
 * which a canvas draws as an arc. The paths use only absolute M, L, H, V and Z.
 */
export function shapeCorners(shape: ShapeName, r: number): number[] | null {
  if (shape === 'circle') return null;
  const corners: number[] = [];
  let x = 0;
  let y = 0;
  for (const [, cmd, args] of shapePath(shape, r).matchAll(/([MLHVZ])([^MLHVZ]*)/g)) {
    const nums = (args ?? '').split(/[ ,]+/).filter(Boolean).map(Number);
    if (cmd === 'H') x = nums[0] ?? x;
    else if (cmd === 'V') y = nums[0] ?? y;
    else if (cmd === 'M' || cmd === 'L') [x = x, y = y] = nums;
    else continue;
    corners.push(x, y);
  }
  return corners;
}

/** Adds one person's shape, centred on (x, y) and scaled by s, to the context's current path. */
export function traceShape(
  ctx: CanvasRenderingContext2D,
  corners: readonly number[] | null,
  r: number,
  x: number,
  y: number,
  s: number,
): void {
  if (!corners) {
    ctx.moveTo(x + r * s, y);
    ctx.arc(x, y, r * s, 0, 2 * Math.PI);
    return;
  }
  ctx.moveTo(x + corners[0]! * s, y + corners[1]! * s);
  for (let i = 2; i < corners.length; i += 2) ctx.lineTo(x + corners[i]! * s, y + corners[i + 1]! * s);
  ctx.closePath();
}
