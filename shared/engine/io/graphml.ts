/**
 * GraphML rooms (the GraphML Primer, graphdrawing.org): `edgedefault`, per-edge `directed`, and a
 * tie strength in a `<data>` whose `<key>` has attr.name "strength" or "weight"; node labels
 * and groups from keys named label/name and group. Read by xml-reader.ts (iterative, nesting
 * bounded, deep elements checked but not kept) after rejecting any DOCTYPE, ENTITY or other markup
 * declaration (no entity expansion, no external loads) and capping the size. A missing <data>
 * takes the key's default (else 1); an empty one is read as 1 with a warning, as in CSV.
 */
import type { RoomGraph } from '../graph';
import { IssueList, type ParseOptions, type ParseResult } from './issues';
import { clip, RoomBuilder } from './room-builder';
import { checkTextSize } from './text-limits';
import { attrOf as attr, readXml, type XmlElement } from './xml-reader';

/** GraphML files are verbose, so their default cap is lower than the other formats'. */
export const GRAPHML_DEFAULT_MAX_CHARS = 16 * 1024 * 1024;

export function parseGraphml(text: string, options: ParseOptions = {}): ParseResult {
  const issues = new IssueList('graphml', 500, options.maxErrors);
  const builder = new RoomBuilder(issues, options);
  let directed = false;
  const sized = checkTextSize(text, { ...options, maxChars: options.maxChars ?? GRAPHML_DEFAULT_MAX_CHARS }, issues);
  const root = sized ? safeRoot(text, issues) : null;
  const g = root ? firstGraph(root, issues) : null;
  if (root && g) {
    const keys = readKeys(childrenOf(root, 'key'));
    const defaultDirected = readEdgeDefault(g, issues);
    addNodes(g, keys, builder, issues);
    directed = addEdges(g, keys, defaultDirected, builder, issues);
  }
  const graph = builder.finish(directed, 'graphml');
  issues.finish();
  return { graph, warnings: issues.warnings, errors: issues.errors, meta: { format: 'graphml' as const } };
}

/** The <graphml> root element, or null with an error when the text declares markup, is not XML or has another root. */
function safeRoot(text: string, issues: IssueList): XmlElement | null {
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
    return null;
  }
  const read = readXml(text);
  if (read.error) {
    const e = read.error;
    const what = e.tooDeep ? 'not accepted:' : 'not well-formed XML:';
    issues.error(e.tooDeep ? 'too-deep' : 'syntax', `${what} ${e.message} (column ${e.column}, byte ${e.offset + 1})`, { line: e.line });
    return null;
  }
  const root = read.root;
  if (root.name !== 'graphml') {
    issues.error('syntax', `the root element must be <graphml>, not <${clip(root.name)}>`, { element: '<graphml>' });
    return null;
  }
  return root;
}

/** The first <graph> (a warning when there are more), or null with an error when there is none. */
function firstGraph(root: XmlElement, issues: IssueList): XmlElement | null {
  const graphs = childrenOf(root, 'graph');
  if (graphs.length === 0) {
    issues.error('missing-field', 'there is no <graph> element inside <graphml>', { element: '<graph>' });
    return null;
  }
  if (graphs.length > 1)
    issues.warn('ignored-column', `the file has ${graphs.length} <graph> elements; only the first was read`, { element: '<graph> #2' });
  return graphs[0];
}

/** Whether edges are directed unless they say otherwise (an error for a value other than the two allowed). */
function readEdgeDefault(g: XmlElement, issues: IssueList): boolean {
  const edgeDefault = attr(g, 'edgedefault');
  if (edgeDefault !== undefined && edgeDefault !== 'directed' && edgeDefault !== 'undirected') {
    issues.error('syntax', `edgedefault must be "directed" or "undirected", not "${clip(edgeDefault)}"`, {
      element: '<graph>',
      field: 'edgedefault',
    });
  }
  return edgeDefault === 'directed';
}

function addNodes(g: XmlElement, keys: Keys, builder: RoomBuilder, issues: IssueList): void {
  const nodes = childrenOf(g, 'node');
  for (let i = 0; i < nodes.length && !issues.full; i++) {
    const element = `<node> #${i + 1}`;
    const data = dataOf(nodes[i], keys);
    builder.addPerson(attr(nodes[i], 'id'), data.get(keys.label ?? ''), data.get(keys.group ?? ''), { element, field: 'id' });
  }
}

/** Adds the edges as ties and returns whether the room is directed (any directed edge makes it so). */
function addEdges(g: XmlElement, keys: Keys, defaultDirected: boolean, builder: RoomBuilder, issues: IssueList): boolean {
  const edges = childrenOf(g, 'edge');
  const edgeDirected = edges.map((edge) => {
    const d = attr(edge, 'directed');
    return d === undefined ? defaultDirected : d === 'true' || d === '1';
  });
  const directed = edges.length === 0 ? defaultDirected : edgeDirected.some((d) => d);
  if (directed && edgeDirected.some((d) => !d)) {
    issues.warn(
      'mixed-direction',
      'the file mixes directed and undirected edges; the room is read as directed and each undirected edge as two ties, one each way',
      { element: '<graph>' },
    );
  }
  const strengthField = keys.strengthName ?? 'strength';
  for (let i = 0; i < edges.length && !issues.full; i++) {
    const edge = edges[i];
    const id = attr(edge, 'id');
    const element = `<edge> #${i + 1}${id !== undefined ? ` (id "${clip(id)}")` : ''}`;
    const source = attr(edge, 'source');
    const target = attr(edge, 'target');
    if (source === undefined) issues.error('missing-field', 'the edge has no source attribute', { element, field: 'source' });
    if (target === undefined) issues.error('missing-field', 'the edge has no target attribute', { element, field: 'target' });
    if (source === undefined || target === undefined) continue;
    const strength = keys.strength !== undefined ? dataOf(edge, keys).get(keys.strength) : undefined;
    const fields = { source: 'source', target: 'target', strength: strengthField };
    builder.addTie(source, target, strength, { element }, fields, directed);
    if (directed && !edgeDirected[i]) builder.addTie(target, source, strength, { element }, fields, directed);
  }
  return directed;
}

interface Keys {
  strength?: string;
  strengthName?: string;
  label?: string;
  group?: string;
  defaults: Map<string, string>;
}

function readKeys(list: XmlElement[]): Keys {
  const keys: Keys = { defaults: new Map() };
  for (const key of list) {
    const id = attr(key, 'id');
    const name = (attr(key, 'attr.name') ?? '').toLowerCase();
    const scope = attr(key, 'for') ?? 'all';
    if (id === undefined) continue;
    const def = childrenOf(key, 'default')[0];
    if (def !== undefined) keys.defaults.set(id, def.text);
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

function dataOf(el: XmlElement, keys: Keys): Map<string, string> {
  const out = new Map(keys.defaults);
  for (const d of el.children) {
    if (d.name !== 'data') continue;
    const key = attr(d, 'key');
    if (key !== undefined) out.set(key, d.text);
  }
  return out;
}

function childrenOf(el: XmlElement, name: string): XmlElement[] {
  return el.children.filter((c) => c.name === name);
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
