/**
 * The briefing sheet: whom to brief, in which order, and what to expect (room average, "90% will
 * have heard within N minutes"), with the model caution, the date and the room version. As JSON
 * for the printable page, as CSV (every cell protected against formula injection) and as a PDF
 * with our own simple layout (pdfkit, self-hosted font).
 */
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { clockMinutes, clockTimes, DEFAULT_SEND_AT, formatClock, formatUtc } from '../../shared/api/briefing-clock';
import type { BriefingSheet } from '../../shared/api/plans';
import { writeCsvRows } from '../../shared/engine/index';
import { parseResults, parseSnapshot } from './dto';
import type { LoadedPlan } from './service';
import { roomName, roomVersion } from './store';
import { planError } from './validate';
import { personAt } from './snapshot';
import { itemAt } from '../../shared/checked';

/** The cautions printed on every sheet (screen, CSV and PDF): the server writes the sheet, so the words live here. */
const MODEL_CAUTIONS: readonly string[] = [
  'The model is a simplification of real conversation; treat these numbers as a planning aid.',
  "A person's score says where they sit in the map, not what they are worth: never use it to judge or rank people's performance.",
  'Who-talks-to-whom data about employees is personal data: keep this sheet to the people who need it.',
];

const fmt = (v: number, digits = 1) => (Math.round(v * 10 ** digits) / 10 ** digits).toFixed(digits);

function shareWords(share: number): string {
  if (share === 0.5) return 'Half of the people not briefed';
  if (share === 1) return 'Everyone';
  return `${Math.round(share * 100)}% of the people not briefed`;
}

export async function briefingSheet(plan: LoadedPlan): Promise<BriefingSheet> {
  const results = parseResults(plan);
  if (plan.status !== 'ready' || !results || plan.average === null) {
    throw planError('not_ready', 'This plan is not computed yet: the briefing sheet needs a finished plan.');
  }
  const snapshot = parseSnapshot(plan);
  const mph = plan.settings.minutesPerHop;
  const current = (await roomVersion(plan.roomId)) ?? plan.roomVersion;
  const expectations = results.curve.quantiles
    .filter((q) => q.share < 1)
    .map((q) => ({
      share: q.share,
      hop: q.hop,
      minutes: q.minutes,
      line:
        q.hop === null || q.minutes === null
          ? `${shareWords(q.share)}: not expected within the hops computed.`
          : `${shareWords(q.share)} will have heard within ${fmt(q.minutes, 0)} minutes (${q.hop} ${q.hop === 1 ? 'hop' : 'hops'}).`,
    }));
  return {
    planId: plan.id,
    planName: plan.name,
    roomName: await roomName(plan.roomId),
    roomVersion: plan.roomVersion,
    stale: current !== plan.roomVersion,
    generatedAt: new Date().toISOString(),
    minutesPerHop: mph,
    starters: (plan.starters ?? []).map((s, i) => ({ personId: s.personId, personKey: s.key, name: s.name, group: s.group, order: i + 1 })),
    people: snapshot.personIds.length,
    average: plan.average,
    averageMinutes: plan.average * mph,
    expectations,
    cautions: [...MODEL_CAUTIONS],
  };
}

/** One table: starters in briefing order, then everyone else by expected hops. */
export async function briefingCsv(plan: LoadedPlan): Promise<string> {
  await briefingSheet(plan);
  const snapshot = parseSnapshot(plan);
  const h = parseResults(plan)!.h;
  const mph = plan.settings.minutesPerHop;
  const order = new Map((plan.starters ?? []).map((s, i) => [s.personId, i + 1]));
  const rows = snapshot.personIds.map((id, i) => ({ i, id, order: order.get(id) ?? null, hops: h[i] ?? Infinity }));
  rows.sort((a, b) => (a.order ?? Infinity) - (b.order ?? Infinity) || a.hops - b.hops || a.i - b.i);
  const out: string[][] = [['briefing order', 'person key', 'name', 'group', 'role', 'expected hops to hear', 'expected minutes']];
  for (const r of rows) {
    const person = personAt(snapshot, r.i);
    out.push([
      r.order === null ? '' : String(r.order),
      person.key,
      person.name,
      person.group ?? '',
      r.order === null ? 'hears by word of mouth' : 'brief first',
      Number.isFinite(r.hops) ? r.hops.toFixed(3) : '',
      Number.isFinite(r.hops) ? (r.hops * mph).toFixed(1) : '',
    ]);
  }
  return '\uFEFF' + writeCsvRows(out);
}

const require = createRequire(import.meta.url);
function fontFile(weight: 400 | 600): string | null {
  try {
    const f = require.resolve(`@fontsource/source-sans-3/files/source-sans-3-latin-${weight}-normal.woff`);
    return existsSync(f) ? f : null;
  } catch {
    return null;
  }
}

/**
 * The sheet as a PDF with everything the screen sheet has: the starters with a "Briefed at" column
 * to fill in, what to expect, the clock-time section for the chosen start time (24-hour), cautions.
 */
export async function briefingPdf(plan: LoadedPlan, sendAt: string): Promise<Buffer> {
  const sheet = await briefingSheet(plan);
  const doc = new PDFDocument({
    size: 'A4',
    margin: 56,
    info: { Title: `Briefing sheet: ${sheet.planName}`, Author: 'Ripplehall' },
  });
  const regular = fontFile(400);
  const bold = fontFile(600);
  if (regular && bold) {
    doc.registerFont('body', regular);
    doc.registerFont('strong', bold);
  } else {
    doc.registerFont('body', 'Helvetica');
    doc.registerFont('strong', 'Helvetica-Bold');
  }
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  heading(doc, sheet);
  starterTable(doc, sheet);
  expectations(doc, sheet, sendAt);
  doc.moveDown(1);
  doc.font('strong').fontSize(12).fillColor('#000').text('Please keep in mind', 56);
  doc.font('body').fontSize(10).fillColor('#333');
  for (const c of sheet.cautions) doc.text(`• ${c}`, { indent: 8 });
  doc.end();
  return done;
}

type Doc = InstanceType<typeof PDFDocument>;

function heading(doc: Doc, sheet: BriefingSheet): void {
  doc.font('strong').fontSize(20).text('Briefing sheet');
  doc
    .font('body')
    .fontSize(11)
    .fillColor('#444')
    .text(
      `${sheet.roomName} · plan "${sheet.planName}" · room version ${sheet.roomVersion} · ${sheet.people} people · ` +
        `one hop ≈ ${fmt(sheet.minutesPerHop, 1)} min · prepared ${formatUtc(sheet.generatedAt)}`,
    );
  if (sheet.stale)
    doc.fillColor('#8a3b12').text('The room has changed since this plan was computed: the numbers below are for the earlier version.');
  doc.moveDown(1).fillColor('#000');
}

/** Starters in briefing order, with an empty "Briefed at" column to fill in by hand. */
function starterTable(doc: Doc, sheet: BriefingSheet): void {
  const n = sheet.starters.length;
  doc
    .font('strong')
    .fontSize(14)
    .text(`1. Brief these ${n} ${n === 1 ? 'person' : 'people'} first, in this order`);
  doc.moveDown(0.4);
  const cols = [
    { title: '#', x: 56, w: 24 },
    { title: 'Person', x: 84, w: 170 },
    { title: 'Group', x: 258, w: 100 },
    { title: 'Id', x: 362, w: 80 },
    { title: 'Briefed at', x: 446, w: 93 },
  ];
  const row = (cells: string[], font: 'body' | 'strong') => {
    const y = doc.y;
    doc.font(font).fontSize(11);
    cells.forEach((c, i) => {
      const col = itemAt(cols, i, 'briefing table column');
      doc.text(c, col.x, y, { width: col.w, lineBreak: false, ellipsis: true });
    });
    doc
      .moveTo(56, y + 16)
      .lineTo(539, y + 16)
      .lineWidth(0.5)
      .strokeColor('#999')
      .stroke();
    doc.y = y + 22;
  };
  row(
    cols.map((c) => c.title),
    'strong',
  );
  for (const s of sheet.starters) row([String(s.order), s.name, s.group ?? '—', s.personKey, ''], 'body');
  doc.x = 56;
  doc.moveDown(0.4);
  doc
    .font('body')
    .fontSize(10)
    .fillColor('#444')
    .text('Ask each of them to pass the message on when colleagues ask. Everyone else hears by word of mouth.', 56);
  doc.fillColor('#000').moveDown(1);
}

function expectations(doc: Doc, sheet: BriefingSheet, raw: string): void {
  const sendAt = formatClock(clockMinutes(raw) ?? clockMinutes(DEFAULT_SEND_AT)!);
  doc.font('strong').fontSize(14).text('2. What to expect', 56);
  doc.moveDown(0.4).font('body').fontSize(12);
  for (const e of sheet.expectations) doc.text(`• ${e.line}`, { indent: 8 });
  doc.text(
    `• On average, someone who was not briefed hears after about ${fmt(sheet.average, 1)} hops, that is about ${fmt(sheet.averageMinutes, 0)} minutes.`,
    { indent: 8 },
  );
  doc.moveDown(0.8);
  doc.font('strong').fontSize(12).text(`Clock times if the message goes out at ${sendAt}`);
  doc.font('body').fontSize(12);
  const times = clockTimes(sheet.expectations, sendAt);
  if (times.length === 0) doc.text('• No clock times: the expected times are beyond the hops computed.', { indent: 8 });
  for (const t of times) doc.text(`• ${t.line}`, { indent: 8 });
}
