/**
 * GraphML rooms (the GraphML Primer, graphdrawing.org): `edgedefault`, per-edge `directed`, and a
 * tie strength in a `<data>` whose `<key>` has attr.name "strength" or "weight"; node labels
 * and groups from keys named label/name and group. Parsed with fast-xml-parser after rejecting
 * any DOCTYPE, ENTITY or other markup declaration (no entity expansion, no external loads) and
 * capping the size.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import type { RoomGraph } from '../graph';
import { IssueList, type ParseOptions, type ParseResult } from './issues';
import { clip, RoomBuilder } from './room-builder';
import { checkTextSize } from './text-limits';

/** GraphML files grow about 10x in memory when parsed, so their default cap is lower. */
export const GRAPHML_DEFAULT_MAX_CHARS = 16 * 1024 * 1024;

type XmlNode = { [key: string]: unknown };

const LISTS = new Set(['key', 'graph', 'node', 'edge', 'data']);

export function parseGraphml(text: string, options: ParseOptions = {}): ParseResult {
  const issues = new IssueList('graphml');
  const builder = new RoomBuilder(issues, options);
  let directed = false;
  const done = () => {
    const graph = builder.finish(directed, 'graphml');
    issues.finish();
    return { graph, warnings: issues.warnings, errors: issues.errors, meta: { format: 'graphml' as const } };
  };
  if (!checkTextSize(text, { ...options, maxChars: options.maxChars ?? GRAPHML_DEFAULT_MAX_CHARS }, issues)) return done();
  const declaration = /<!\s*(DOCTYPE|ENTITY|ELEMENT|ATTLIST|NOTATION)/i.exec(text);
  if (declaration) {
    issues.error(
      'unsafe-markup',
      `the file contains a <!${declaration[1].toUpperCase()} declaration, which is not accepted (it can expand entities or load other files); remove it`,
      {
        line: lineAt(text, declaration.index),
        element: `<!${declaration[1].toUpperCase()}>`,
      },
    );
    return done();
  }
  const valid = XMLValidator.validate(text);
  if (valid !== true) {
    issues.error('syntax', `not well-formed XML: ${valid.err.msg}`, { line: valid.err.line });
    return done();
  }
  const parser = new XMLParser({
    ignoreAttributes: false,
    attributeNamePrefix: '@',
    removeNSPrefix: true,
    parseTagValue: false,
    parseAttributeValue: false,
    trimValues: false,
    processEntities: true,
    // Also decodes numeric character references (&#10;); named HTML entities are harmless here.
    htmlEntities: true,
    isArray: (name) => LISTS.has(name),
  });
  const doc = parser.parse(text) as XmlNode;
  const rawRoot = doc['graphml'];
  const root = (typeof rawRoot === 'object' && rawRoot !== null ? rawRoot : {}) as XmlNode;
  if (rawRoot === undefined) {
    issues.error('syntax', 'the root element must be <graphml>', { element: '<graphml>' });
    return done();
  }
  const graphs = (root['graph'] as XmlNode[] | undefined) ?? [];
  if (graphs.length === 0) {
    issues.error('missing-field', 'there is no <graph> element inside <graphml>', { element: '<graph>' });
    return done();
  }
  if (graphs.length > 1)
    issues.warn('ignored-column', `the file has ${graphs.length} <graph> elements; only the first was read`, { element: '<graph> #2' });
  const g = graphs[0];
  const keys = readKeys((root['key'] as XmlNode[] | undefined) ?? []);
  const edgeDefault = attr(g, 'edgedefault');
  if (edgeDefault !== undefined && edgeDefault !== 'directed' && edgeDefault !== 'undirected') {
    issues.error('syntax', `edgedefault must be "directed" or "undirected", not "${clip(edgeDefault)}"`, {
      element: '<graph>',
      field: 'edgedefault',
    });
  }
  const defaultDirected = edgeDefault === 'directed';

  const nodes = (g['node'] as XmlNode[] | undefined) ?? [];
  nodes.forEach((node, i) => {
    const element = `<node> #${i + 1}`;
    const data = dataOf(node, keys);
    builder.addPerson(attr(node, 'id'), data.get(keys.label ?? ''), data.get(keys.group ?? ''), { element, field: 'id' });
  });

  const edges = (g['edge'] as XmlNode[] | undefined) ?? [];
  const edgeDirected = edges.map((edge) => {
    const d = attr(edge, 'directed');
    return d === undefined ? defaultDirected : d === 'true' || d === '1';
  });
  directed = edges.length === 0 ? defaultDirected : edgeDirected.some((d) => d);
  if (directed && edgeDirected.some((d) => !d)) {
    issues.warn(
      'mixed-direction',
      'the file mixes directed and undirected edges; the room is read as directed and each undirected edge as two ties, one each way',
      { element: '<graph>' },
    );
  }
  const strengthField = keys.strengthName ?? 'strength';
  edges.forEach((edge, i) => {
    const id = attr(edge, 'id');
    const element = `<edge> #${i + 1}${id !== undefined ? ` (id "${clip(id)}")` : ''}`;
    const source = attr(edge, 'source');
    const target = attr(edge, 'target');
    if (source === undefined) issues.error('missing-field', 'the edge has no source attribute', { element, field: 'source' });
    if (target === undefined) issues.error('missing-field', 'the edge has no target attribute', { element, field: 'target' });
    if (source === undefined || target === undefined) return;
    const strength = keys.strength !== undefined ? dataOf(edge, keys).get(keys.strength) : undefined;
    const fields = { source: 'source', target: 'target', strength: strengthField };
    builder.addTie(source, target, strength, { element }, fields, directed);
    if (directed && !edgeDirected[i]) builder.addTie(target, source, strength, { element }, fields, directed);
  });
  return done();
}

interface Keys {
  strength?: string;
  strengthName?: string;
  label?: string;
  group?: string;
  defaults: Map<string, string>;
}

function readKeys(list: XmlNode[]): Keys {
  const keys: Keys = { defaults: new Map() };
  for (const key of list) {
    const id = attr(key, 'id');
    const name = (attr(key, 'attr.name') ?? '').toLowerCase();
    const scope = attr(key, 'for') ?? 'all';
    if (id === undefined) continue;
    const def = key['default'];
    if (def !== undefined) keys.defaults.set(id, textOf(def));
    const forEdge = scope === 'edge' || scope === 'all';
    const forNode = scope === 'node' || scope === 'all';
    if (forEdge && (name === 'strength' || (name === 'weight' && keys.strengthName !== 'strength'))) {
      keys.strength = id;
      keys.strengthName = attr(key, 'attr.name');
    }
    if (forNode && (name === 'label' || (name === 'name' && keys.label === undefined))) keys.label = id;
    if (forNode && name === 'group') keys.group = id;
  }
  return keys;
}

function dataOf(el: XmlNode, keys: Keys): Map<string, string> {
  const out = new Map(keys.defaults);
  for (const d of (el['data'] as XmlNode[] | undefined) ?? []) {
    const key = attr(d, 'key');
    if (key !== undefined) out.set(key, textOf(d));
  }
  return out;
}

function attr(el: XmlNode, name: string): string | undefined {
  const v = el[`@${name}`];
  return typeof v === 'string' ? v : undefined;
}

function textOf(v: unknown): string {
  if (typeof v === 'string') return v;
  if (typeof v === 'number') return String(v);
  if (v && typeof v === 'object' && typeof (v as XmlNode)['#text'] === 'string') return (v as XmlNode)['#text'] as string;
  return '';
}

function lineAt(text: string, pos: number): number {
  let line = 1;
  for (let i = 0; i < pos; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}

function esc(s: string): string {
  return s
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/\r/g, '&#13;')
    .replace(/\n/g, '&#10;')
    .replace(/\t/g, '&#9;');
}

/** Writes GraphML 1.0 with keys for label, group and weight (the name general tools read). */
export function writeGraphml(graph: RoomGraph): string {
  const out: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<graphml xmlns="http://graphml.graphdrawing.org/xmlns" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="http://graphml.graphdrawing.org/xmlns http://graphml.graphdrawing.org/xmlns/1.0/graphml.xsd">',
    '  <key id="label" for="node" attr.name="label" attr.type="string"/>',
    '  <key id="group" for="node" attr.name="group" attr.type="string"/>',
    '  <key id="weight" for="edge" attr.name="weight" attr.type="double"/>',
    `  <graph id="room" edgedefault="${graph.directed ? 'directed' : 'undirected'}">`,
  ];
  graph.ids.forEach((id, i) => {
    const label = graph.labels?.[i];
    const group = graph.groups?.[i];
    const data =
      (label !== undefined && label !== id ? `<data key="label">${esc(label)}</data>` : '') +
      (group !== undefined && group !== null ? `<data key="group">${esc(group)}</data>` : '');
    out.push(data ? `    <node id="${esc(id)}">${data}</node>` : `    <node id="${esc(id)}"/>`);
  });
  graph.ties.forEach((t, i) => {
    out.push(
      `    <edge id="e${i}" source="${esc(graph.ids[t.source])}" target="${esc(graph.ids[t.target])}"><data key="weight">${t.strength}</data></edge>`,
    );
  });
  out.push('  </graph>', '</graphml>', '');
  return out.join('\n');
}
