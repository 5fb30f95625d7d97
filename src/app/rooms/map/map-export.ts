import type { MapGraph } from './map-graph';
import { attrs, type MapRenderer, SVG_NS } from './map-renderer';

/** A stand-alone SVG document of the map, with its size in drawing units. */
export interface MapDocument {
  svg: string;
  width: number;
  height: number;
}

/** Room around the drawn content in the exported picture. */
const EXPORT_PADDING = 24;

/**
 * The map as a stand-alone SVG document (for the PNG export), framed around everyone: the frame
 * is the drawn content's own box (names included, so none is cut at the edge), in the viewport
 * group's coordinates, i.e. before the pan and zoom. Null for an empty room.
 */
export function mapSvgDocument(svg: SVGSVGElement, renderer: MapRenderer, graph: MapGraph): MapDocument | null {
  const points = graph.points();
  if (!points.length) return null;
  const pad = EXPORT_PADDING;
  // The hidden helpers (the tie draft line, the find ring) are left out of the frame.
  const boxes = [renderer.peopleLayer.getBBox(), renderer.tieLayer.getBBox()].filter((b) => b.width > 0 || b.height > 0);
  const xs = points.map((p) => p.x);
  const ys = points.map((p) => p.y);
  const x0 = Math.min(...boxes.map((b) => b.x), ...xs) - pad;
  const y0 = Math.min(...boxes.map((b) => b.y), ...ys) - pad;
  const width = Math.max(...boxes.map((b) => b.x + b.width), ...xs) - x0 + pad;
  const height = Math.max(...boxes.map((b) => b.y + b.height), ...ys) - y0 + pad;
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.setAttribute('xmlns', SVG_NS);
  clone.setAttribute('viewBox', `${x0} ${y0} ${width} ${height}`);
  clone.setAttribute('width', String(Math.round(width)));
  clone.setAttribute('height', String(Math.round(height)));
  clone.querySelector('.viewport')?.removeAttribute('transform');
  clone.querySelector('.rh-find-ring')?.remove();
  clone.querySelector('.people')?.setAttribute('class', 'people');
  const bg = document.createElementNS(SVG_NS, 'rect');
  attrs(bg, { x: x0, y: y0, width, height, fill: '#ffffff' });
  clone.prepend(bg);
  return { svg: new XMLSerializer().serializeToString(clone), width, height };
}

/**
 * A PNG of the map made in the browser: the map's SVG (presentation attributes only) drawn
 * onto a canvas at twice the size. An SVG drawn as an image cannot reach the page's fonts, so
 * the shipped font (Source Sans 3, self-hosted) is embedded in it as a data URL; without it
 * the names would fall back to a serif. No request leaves the page.
 */
export async function downloadMapPng(doc: MapDocument, fileName: string): Promise<void> {
  const scale = Math.min(2, 8000 / Math.max(doc.width, doc.height));
  const svg = withFont(doc.svg, await embeddedFontCss());
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.decoding = 'sync';
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('The map picture could not be drawn.'));
      img.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(doc.width * scale);
    canvas.height = Math.round(doc.height * scale);
    const ctx = canvas.getContext('2d')!;
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0, doc.width, doc.height);
    await downloadCanvasPng(canvas, fileName);
  } finally {
    URL.revokeObjectURL(url);
  }
}

/** Saves a canvas as a PNG file through the browser's download. */
export async function downloadCanvasPng(canvas: HTMLCanvasElement, fileName: string): Promise<void> {
  const png = await new Promise<Blob>((resolve, reject) =>
    canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('No PNG'))), 'image/png'),
  );
  const a = document.createElement('a');
  a.href = URL.createObjectURL(png);
  a.download = fileName.replace(/[\\/:*?"<>|]/g, '_');
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
}

const FAMILY = 'Source Sans 3';

/** The @font-face of the shipped label font (weight 400), as CSS with the font inlined. */
async function embeddedFontCss(): Promise<string> {
  const src = fontUrl();
  if (!src) return '';
  try {
    const bytes = new Uint8Array(await (await fetch(src)).arrayBuffer());
    let bin = '';
    for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
    return `@font-face{font-family:'${FAMILY}';font-weight:400;src:url(data:font/woff2;base64,${btoa(bin)}) format('woff2');}`;
  } catch {
    return '';
  }
}

/** The URL of the latin 400 face from the page's own style sheets (the build gives it a hashed name). */
function fontUrl(): string | null {
  for (const sheet of Array.from(document.styleSheets)) {
    let rules: CSSRuleList;
    try {
      rules = sheet.cssRules;
    } catch {
      continue;
    }
    for (const rule of Array.from(rules)) {
      if (!(rule instanceof CSSFontFaceRule)) continue;
      const family = rule.style.getPropertyValue('font-family').replace(/["']/g, '').trim();
      const weight = rule.style.getPropertyValue('font-weight').trim();
      const range = rule.style.getPropertyValue('unicode-range');
      if (family !== FAMILY || (weight && weight !== '400' && weight !== 'normal') || (range && !/U\+0+-0*FF\b/i.test(range))) continue;
      const woff2 = /url\(["']?([^"')]+\.woff2)["']?\)/.exec(rule.style.getPropertyValue('src'))?.[1];
      if (woff2) return new URL(woff2, sheet.href ?? document.baseURI).href;
    }
  }
  return null;
}

/** Puts the font into the SVG and makes the names use it alone (no serif or other fallback). */
export function withFont(svg: string, css: string): string {
  if (!css) return svg;
  const open = svg.indexOf('>', svg.indexOf('<svg')) + 1;
  const style = `<style>${css} text{font-family:'${FAMILY}' !important;}</style>`;
  return svg.slice(0, open) + style + svg.slice(open);
}
