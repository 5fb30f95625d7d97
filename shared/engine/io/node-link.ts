/**
 * Node-link JSON rooms: `{ "directed": bool, "nodes": [{ "id", "label"|"name", "group" }],
 * "links"|"edges": [{ "source", "target", "weight"|"strength" }] }`. Numeric ids are read as
 * their decimal text, so ids print back as in the file.
 */
import type { RoomGraph } from '../graph';
import { IssueList, type ParseOptions, type ParseResult } from './issues';
import { JsonNumber, JsonObject, JsonSkipped, readJson, type JsonValue } from './json-reader';
import { clip, RoomBuilder } from './room-builder';
import { checkTextSize } from './text-limits';

/** Scalar JSON values, as the layout and settings of a room written by Ripplehall carry them. */
export type JsonScalar = string | number | boolean | null;

/** What a node-link file carries besides the room: node positions and the "graph" object's scalars. */
export interface NodeLinkExtras {
  /** x, y and pinned of the nodes that have any, by person id. */
  readonly layout: Map<string, { readonly x?: number; readonly y?: number; readonly pinned?: boolean }>;
  /** Scalar members of the top-level "graph" object, by key. */
  readonly graph: Map<string, JsonScalar>;
}

/** Containers are built to this depth (document, list, node, endpoint object); deeper ones are only checked. */
const BUILD_DEPTH = 4;

export function parseNodeLink(text: string, options: ParseOptions = {}): ParseResult {
  const issues = new IssueList('json', 500, options.maxErrors);
  const builder = new RoomBuilder(issues, options);
  const extras: NodeLinkExtras = { layout: new Map(), graph: new Map() };
  let directed = false;
  const done = () => {
    const graph = builder.finish(directed, 'json');
    issues.finish();
    return { graph, warnings: issues.warnings, errors: issues.errors, meta: { format: 'json' as const, nodeLink: extras } };
  };
  if (!checkTextSize(text, options, issues)) return done();
  const read = readJson(text, { buildDepth: BUILD_DEPTH });
  if (read.error) {
    const e = read.error;
    const what = e.tooDeep ? 'not accepted: the JSON is' : 'not valid JSON:';
    issues.error(e.tooDeep ? 'too-deep' : 'syntax', `${what} ${e.message} (column ${e.column}, byte ${e.offset + 1})`, { line: e.line });
    return done();
  }
  const doc = read.value;
  if (!(doc instanceof JsonObject)) {
    issues.error('syntax', 'the file must hold one JSON object with "nodes" and "links" (or "edges")');
    return done();
  }
  const flag = doc.get('directed');
  if (flag !== undefined && typeof flag !== 'boolean') {
    issues.error('syntax', `"directed" must be true or false, not ${shown(flag)}`, { element: 'directed' });
  }
  directed = flag === true;
  readGraphScalars(doc.get('graph'), extras);
  const nodes = doc.get('nodes');
  if (!Array.isArray(nodes)) {
    issues.error('missing-field', 'there is no "nodes" list; add "nodes": [{"id": ...}, ...]', { element: 'nodes' });
    return done();
  }
  for (let i = 0; i < nodes.length && !issues.full; i++) readNode(nodes[i], `nodes[${i}]`, builder, issues, extras);
  const linkKey = doc.has('links') ? 'links' : 'edges';
  if (doc.has('links') && doc.has('edges')) {
    issues.warn('ignored-column', 'both "links" and "edges" are present; "links" was read and "edges" ignored', { element: 'edges' });
  }
  const links = doc.get(linkKey) ?? [];
  if (!Array.isArray(links)) {
    issues.error('syntax', `"${linkKey}" must be a list of ties`, { element: linkKey });
    return done();
  }
  for (let i = 0; i < links.length && !issues.full; i++) readLink(links[i], `${linkKey}[${i}]`, builder, issues, directed);
  return done();
}

function readNode(node: JsonValue, element: string, builder: RoomBuilder, issues: IssueList, extras: NodeLinkExtras): void {
  if (!(node instanceof JsonObject)) {
    issues.error('syntax', `each node must be an object such as {"id": "a"}, not ${shown(node)}`, { element });
    return;
  }
  const label = node.get('label') ?? node.get('name');
  const id = idText(node.get('id'));
  if (!builder.addPerson(id, textOrUndefined(label), textOrUndefined(node.get('group')), { element, field: 'id' })) return;
  const x = finite(node.get('x'));
  const y = finite(node.get('y'));
  const pinned = node.get('pinned');
  if (x !== undefined || y !== undefined || typeof pinned === 'boolean') {
    extras.layout.set(id as string, { x, y, ...(typeof pinned === 'boolean' ? { pinned } : {}) });
  }
}

function readLink(link: JsonValue, element: string, builder: RoomBuilder, issues: IssueList, directed: boolean): void {
  if (!(link instanceof JsonObject)) {
    issues.error('syntax', `each tie must be an object such as {"source": "a", "target": "b"}, not ${shown(link)}`, { element });
    return;
  }
  const source = link.get('source');
  const target = link.get('target');
  if (source === undefined) issues.error('missing-field', 'the tie has no "source"', { element, field: 'source' });
  if (target === undefined) issues.error('missing-field', 'the tie has no "target"', { element, field: 'target' });
  if (source === undefined || target === undefined) return;
  const field = link.has('strength') ? 'strength' : 'weight';
  if (link.has('strength') && link.has('weight')) {
    issues.warn('ignored-column', '"strength" and "weight" are both given; "strength" was used', { element, field: 'weight' });
  }
  const raw = link.get(field);
  if (raw === '' || raw === null) {
    const what = raw === null ? 'null' : 'empty text ("")';
    issues.error('bad-strength', `the strength is ${what}; write a positive number, or leave the field out (a missing strength means 1)`, {
      element,
      field,
    });
    return;
  }
  builder.addTie(
    idText(endpoint(source)),
    idText(endpoint(target)),
    strengthOf(raw),
    { element },
    { source: 'source', target: 'target', strength: field },
    directed,
  );
}

/** Ties may name people directly or (as some drawing libraries leave them) as `{ "id": ... }`. */
function endpoint(v: JsonValue): JsonValue {
  return v instanceof JsonObject && v.get('id') !== undefined ? v.get('id')! : v;
}

/** Ids are text: a number keeps the digits written in the file (1.0, 1e3, 12345678901234567891). */
function idText(v: JsonValue | undefined): unknown {
  if (v instanceof JsonNumber) return v.text;
  if (v instanceof JsonObject || v instanceof JsonSkipped || Array.isArray(v)) return { shown: shown(v) };
  return v;
}

function strengthOf(v: JsonValue | undefined): unknown {
  if (v instanceof JsonNumber) return v.value === 0 && /[1-9]/.test(v.text.replace(/[eE].*$/, '')) ? v.text : v.value;
  if (v instanceof JsonObject || v instanceof JsonSkipped || Array.isArray(v)) return { shown: shown(v) };
  return v;
}

function readGraphScalars(g: JsonValue | undefined, extras: NodeLinkExtras): void {
  if (!(g instanceof JsonObject)) return;
  g.keys.forEach((key, i) => {
    const v = g.values[i];
    if (v instanceof JsonNumber) extras.graph.set(key, v.value);
    else if (v === null || typeof v === 'string' || typeof v === 'boolean') extras.graph.set(key, v);
  });
}

function finite(v: JsonValue | undefined): number | undefined {
  return v instanceof JsonNumber && Number.isFinite(v.value) ? v.value : undefined;
}

function textOrUndefined(v: JsonValue | undefined): string | undefined {
  if (typeof v === 'string') return v;
  if (v instanceof JsonNumber) return v.text;
  return undefined;
}

/** A short rendering of a value for a message. */
function shown(v: JsonValue): string {
  if (v instanceof JsonNumber) return v.text;
  if (v instanceof JsonSkipped || v instanceof JsonObject) return 'an object';
  if (Array.isArray(v)) return 'a list';
  return clip(JSON.stringify(v));
}

export function writeNodeLink(graph: RoomGraph): string {
  const nodes = graph.ids.map((id, i) => {
    const node: Record<string, string> = { id };
    if (graph.labels && graph.labels[i] !== id) node['label'] = graph.labels[i];
    const g = graph.groups?.[i];
    if (g !== undefined && g !== null) node['group'] = g;
    return node;
  });
  const links = graph.ties.map((t) => ({ source: graph.ids[t.source], target: graph.ids[t.target], strength: t.strength }));
  return JSON.stringify({ directed: graph.directed, nodes, links }, null, 1) + '\n';
}
