/**
 * How a group looks on the map: a shape AND a colour, so the map still reads when printed
 * in black and white or seen with a colour-vision deficiency. The colours are the eight of
 * M. Okabe and K. Ito, "Color Universal Design (CUD): how to make figures and presentations
 * that are friendly to colorblind people", 2008 (black left out: it is our outline colour),
 * in our own order; each is paired with a shape of its own. Past eight groups the shapes
 * repeat with a hollow centre so the pairs stay distinct.
 */
import { itemAt } from '../../../../shared/checked';

export type ShapeName = 'circle' | 'square' | 'triangle' | 'diamond' | 'hexagon' | 'star' | 'pentagon' | 'cross';

export interface GroupStyle {
  group: string;
  shape: ShapeName;
  fill: string;
  hollow: boolean;
}

const COLOURS = ['#0072B2', '#E69F00', '#009E73', '#CC79A7', '#56B4E9', '#D55E00', '#F0E442', '#7F7F7F'];
const SHAPES: ShapeName[] = ['circle', 'square', 'triangle', 'diamond', 'hexagon', 'star', 'pentagon', 'cross'];

export const NO_GROUP_STYLE: GroupStyle = { group: '', shape: 'circle', fill: '#ffffff', hollow: false };

/** Styles by group name; the order of `groups` (sorted names) fixes who gets which. */
export function groupStyles(groups: readonly string[]): Map<string, GroupStyle> {
  const out = new Map<string, GroupStyle>();
  groups.forEach((group, i) => {
    const round = Math.floor(i / SHAPES.length);
    out.set(group, {
      group,
      shape: itemAt(SHAPES, i % SHAPES.length, 'group shape'),
      // Shift the colour by one for the second round so shape + colour pairs do not repeat.
      fill: itemAt(COLOURS, (i + round) % COLOURS.length, 'group colour'),
      hollow: round % 2 === 1,
    });
  });
  return out;
}

/** SVG path of a shape centred on 0,0 with about the same area as a circle of radius r. */
export function shapePath(shape: ShapeName, r: number): string {
  switch (shape) {
    case 'circle':
      return `M${r},0A${r},${r} 0 1,1 ${-r},0A${r},${r} 0 1,1 ${r},0Z`;
    case 'square': {
      const s = r * 0.89;
      return `M${-s},${-s}H${s}V${s}H${-s}Z`;
    }
    case 'triangle':
      return polygon(3, r * 1.3, -Math.PI / 2);
    case 'diamond':
      return polygon(4, r * 1.2, -Math.PI / 2);
    case 'hexagon':
      return polygon(6, r * 1.08, 0);
    case 'pentagon':
      return polygon(5, r * 1.12, -Math.PI / 2);
    case 'star':
      return star(5, r * 1.35, r * 0.6);
    case 'cross': {
      const a = r * 0.38;
      const b = r * 1.05;
      return `M${-a},${-b}H${a}V${-a}H${b}V${a}H${a}V${b}H${-a}V${a}H${-b}V${-a}H${-a}Z`;
    }
  }
}

function polygon(sides: number, radius: number, start: number): string {
  const pts: string[] = [];
  for (let i = 0; i < sides; i++) {
    const a = start + (2 * Math.PI * i) / sides;
    pts.push(`${(radius * Math.cos(a)).toFixed(2)},${(radius * Math.sin(a)).toFixed(2)}`);
  }
  return `M${pts.join('L')}Z`;
}

function star(points: number, outer: number, inner: number): string {
  const pts: string[] = [];
  for (let i = 0; i < points * 2; i++) {
    const rad = i % 2 === 0 ? outer : inner;
    const a = -Math.PI / 2 + (Math.PI * i) / points;
    pts.push(`${(rad * Math.cos(a)).toFixed(2)},${(rad * Math.sin(a)).toFixed(2)}`);
  }
  return `M${pts.join('L')}Z`;
}

/** Tie thickness from strength: grows with the square root so one strong tie does not swamp the map. */
export function tieWidth(strength: number, maxStrength: number): number {
  const rel = maxStrength > 0 ? Math.sqrt(strength / maxStrength) : 1;
  return 0.8 + rel * 4.2;
}
