import { itemAt } from '../../../shared/checked';
import type { ReplayScene } from './replay-scene';
import { chainFronts, hasHeard, type Timeline } from './replay-timeline';

/**
 * Draws one frame of the replay on a canvas. Readable without colour: starters are squares
 * marked "S", people who have heard are large filled discs with a dark centre ring and a
 * bold name, people still waiting are small hollow rings with a plain name, and the message
 * on its way is a diamond with a dashed trail.
 */
export const REPLAY_COLOURS = {
  background: '#0d1b26',
  // Ties must read on a projector that washes out dark greys: light and about half opaque.
  tie: 'rgba(200, 216, 232, 0.5)',
  waiting: '#c9d3dc',
  heard: '#ffc94d',
  starter: '#ffffff',
  front: '#6fd3ff',
  justHeard: '#ffffff',
  name: '#f2f5f7',
  nameWaiting: '#b4c2cd',
};

export interface Frame {
  ctx: CanvasRenderingContext2D;
  width: number;
  height: number;
  /** Positions in canvas pixels and the names' spots (replay-scene.ts). */
  scene: ReplayScene;
  ties: readonly { source: number; target: number }[];
  timeline: Timeline;
  t: number;
}

/** Paint order: background, ties, travelling questions, people, starters, names. */
export function drawFrame(f: Frame): void {
  const { ctx, width, height } = f;
  ctx.fillStyle = REPLAY_COLOURS.background;
  ctx.fillRect(0, 0, width, height);
  drawTies(f);
  drawQuestions(f);
  drawStarters(f, drawPeople(f));
  drawNames(f);
}

/** The scene was laid out for this room: every person index has a position. */
function positions(f: Frame): { px: (i: number) => number; py: (i: number) => number } {
  return { px: (i) => itemAt(f.scene.x, i, 'replay x'), py: (i) => itemAt(f.scene.y, i, 'replay y') };
}

function drawTies(f: Frame): void {
  const { ctx } = f;
  const { px, py } = positions(f);
  ctx.strokeStyle = REPLAY_COLOURS.tie;
  ctx.lineWidth = f.timeline.n > 400 ? 1 : 1.6;
  ctx.beginPath();
  for (const t of f.ties) {
    ctx.moveTo(px(t.source), py(t.source));
    ctx.lineTo(px(t.target), py(t.target));
  }
  ctx.stroke();
}

/** Travelling questions: a dashed trail and a diamond at the front. */
function drawQuestions(f: Frame): void {
  const { ctx } = f;
  const { px, py } = positions(f);
  ctx.strokeStyle = REPLAY_COLOURS.front;
  ctx.lineWidth = 2;
  ctx.setLineDash([5, 4]);
  ctx.beginPath();
  const heads: { x: number; y: number }[] = [];
  for (const c of chainFronts(f.timeline, f.t)) {
    // A question that has not left its asker yet is not drawn: at hop 0 it would sit on everyone.
    if (c.trail.length <= 1 && c.along < 0.02) continue;
    const x = px(c.from) + (px(c.to) - px(c.from)) * c.along;
    const y = py(c.from) + (py(c.to) - py(c.from)) * c.along;
    c.trail.forEach((p, k) => (k === 0 ? ctx.moveTo(px(p), py(p)) : ctx.lineTo(px(p), py(p))));
    ctx.lineTo(x, y);
    heads.push({ x, y });
  }
  ctx.stroke();
  ctx.setLineDash([]);
  ctx.fillStyle = REPLAY_COLOURS.front;
  ctx.beginPath();
  const d = f.scene.r * 0.7;
  for (const { x, y } of heads) {
    ctx.moveTo(x, y - d);
    ctx.lineTo(x + d, y);
    ctx.lineTo(x, y + d);
    ctx.lineTo(x - d, y);
    ctx.closePath();
  }
  ctx.fill();
}

/**
 * People, batched by look: one path per kind keeps a 300-person frame to a handful of draw
 * calls. Returns the starters, drawn on top by drawStarters.
 */
function drawPeople(f: Frame): number[] {
  const { ctx, timeline: tl, scene } = f;
  const { px, py } = positions(f);
  const r = scene.r;
  const hop = Math.floor(f.t + 1e-9);
  const heard = new Path2D();
  const heardRing = new Path2D();
  const justHeard = new Path2D();
  const waiting = new Path2D();
  const starters: number[] = [];
  for (let i = 0; i < tl.n; i++) {
    const x = px(i);
    const y = py(i);
    if (tl.starters.has(i)) starters.push(i);
    else if (hasHeard(tl, i, f.t)) {
      heard.moveTo(x + r, y);
      heard.arc(x, y, r, 0, Math.PI * 2);
      heardRing.moveTo(x + r * 0.45, y);
      heardRing.arc(x, y, r * 0.45, 0, Math.PI * 2);
      if (tl.heardAt[i] === hop) {
        justHeard.moveTo(x + r + 4, y);
        justHeard.arc(x, y, r + 4, 0, Math.PI * 2);
      }
    } else {
      waiting.moveTo(x + r * 0.8, y);
      waiting.arc(x, y, r * 0.8, 0, Math.PI * 2);
    }
  }
  ctx.fillStyle = REPLAY_COLOURS.heard;
  ctx.fill(heard);
  ctx.strokeStyle = REPLAY_COLOURS.background;
  ctx.lineWidth = Math.max(1.5, r * 0.25);
  ctx.stroke(heardRing);
  ctx.strokeStyle = REPLAY_COLOURS.justHeard;
  ctx.lineWidth = 2.5;
  ctx.stroke(justHeard);
  ctx.strokeStyle = REPLAY_COLOURS.waiting;
  ctx.lineWidth = 2;
  ctx.stroke(waiting);
  return starters;
}

/** Starters: white squares marked "S". */
function drawStarters(f: Frame, starters: readonly number[]): void {
  const { ctx } = f;
  const { px, py } = positions(f);
  const r = f.scene.r;
  ctx.font = `700 ${Math.round(r * 1.6)}px "Source Sans 3", sans-serif`;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'middle';
  for (const i of starters) {
    const x = px(i);
    const y = py(i);
    ctx.fillStyle = REPLAY_COLOURS.starter;
    ctx.fillRect(x - r * 1.2, y - r * 1.2, r * 2.4, r * 2.4);
    ctx.fillStyle = REPLAY_COLOURS.background;
    ctx.fillText('S', x, y + 1);
  }
}

/** Names at their spots: bold and bright once heard, plain and dimmer while waiting. */
function drawNames(f: Frame): void {
  const { ctx, scene, timeline: tl } = f;
  if (!scene.font) return;
  ctx.textBaseline = 'alphabetic';
  for (const heardNow of [false, true]) {
    ctx.font = `${heardNow ? 700 : 400} ${scene.font}px "Source Sans 3", sans-serif`;
    ctx.fillStyle = heardNow ? REPLAY_COLOURS.name : REPLAY_COLOURS.nameWaiting;
    for (let i = 0; i < tl.n; i++) {
      const label = scene.labels[i];
      if (!label || hasHeard(tl, i, f.t) !== heardNow) continue;
      ctx.textAlign = label.spot.anchor === 'start' ? 'left' : label.spot.anchor === 'end' ? 'right' : 'center';
      ctx.fillText(label.text, itemAt(scene.x, i, 'replay x') + label.spot.dx, itemAt(scene.y, i, 'replay y') + label.spot.dy);
    }
  }
}
