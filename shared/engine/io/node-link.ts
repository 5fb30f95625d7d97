/**
 * Node-link JSON rooms: `{ "directed": bool, "nodes": [{ "id", "label"|"name", "group" }],
 * "links"|"edges": [{ "source", "target", "weight"|"strength" }] }`. Numeric ids are read as
 * their decimal text, so ids print back as in the file.
 */
import type { RoomGraph } from '../graph';
import { IssueList, type ParseOptions, type ParseResult } from './issues';
import { clip, RoomBuilder } from './room-builder';
import { locateJsonError } from './json-locate';
import { checkTextSize } from './text-limits';

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

export function parseNodeLink(text: string, options: ParseOptions = {}): ParseResult {
  const issues = new IssueList('json');
  const builder = new RoomBuilder(issues, options);
  let directed = false;
  const done = () => {
    const graph = builder.finish(directed, 'json');
    issues.finish();
    return { graph, warnings: issues.warnings, errors: issues.errors, meta: { format: 'json' as const } };
  };
  if (!checkTextSize(text, options, issues)) return done();
  let doc: Json;
  try {
    doc = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text) as Json;
  } catch (e) {
    const where = locateJsonError(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
    const detail = where ? `${where.message} at column ${where.column}` : (e as Error).message.split('\n')[0];
    issues.error('syntax', `not valid JSON: ${detail}`, where ? { line: where.line } : {});
    return done();
  }
  if (!isObject(doc)) {
    issues.error('syntax', 'the file must hold one JSON object with "nodes" and "links" (or "edges")');
    return done();
  }
  if (doc['directed'] !== undefined && typeof doc['directed'] !== 'boolean') {
    issues.error('syntax', `"directed" must be true or false, not ${clip(JSON.stringify(doc['directed']))}`, { element: 'directed' });
  }
  directed = doc['directed'] === true;
  const nodes = doc['nodes'];
  if (!Array.isArray(nodes)) {
    issues.error('missing-field', 'there is no "nodes" list; add "nodes": [{"id": ...}, ...]', { element: 'nodes' });
    return done();
  }
  nodes.forEach((node, i) => {
    const element = `nodes[${i}]`;
    if (!isObject(node)) {
      issues.error('syntax', `each node must be an object such as {"id": "a"}, not ${clip(JSON.stringify(node))}`, { element });
      return;
    }
    const label = node['label'] ?? node['name'];
    const group = node['group'];
    builder.addPerson(node['id'], textOrUndefined(label), textOrUndefined(group), { element, field: 'id' });
  });
  const linkKey = doc['links'] !== undefined ? 'links' : 'edges';
  if (doc['links'] !== undefined && doc['edges'] !== undefined) {
    issues.warn('ignored-column', 'both "links" and "edges" are present; "links" was read and "edges" ignored', { element: 'edges' });
  }
  const links = doc[linkKey] ?? [];
  if (!Array.isArray(links)) {
    issues.error('syntax', `"${linkKey}" must be a list of ties`, { element: linkKey });
    return done();
  }
  links.forEach((link, i) => {
    const element = `${linkKey}[${i}]`;
    if (!isObject(link)) {
      issues.error('syntax', `each tie must be an object such as {"source": "a", "target": "b"}, not ${clip(JSON.stringify(link))}`, {
        element,
      });
      return;
    }
    for (const f of ['source', 'target']) {
      if (link[f] === undefined) issues.error('missing-field', `the tie has no "${f}"`, { element, field: f });
    }
    if (link['source'] === undefined || link['target'] === undefined) return;
    const field = link['strength'] !== undefined ? 'strength' : 'weight';
    if (link['strength'] !== undefined && link['weight'] !== undefined) {
      issues.warn('ignored-column', '"strength" and "weight" are both given; "strength" was used', { element, field: 'weight' });
    }
    builder.addTie(
      endpoint(link['source']),
      endpoint(link['target']),
      link[field],
      { element },
      { source: 'source', target: 'target', strength: field },
      directed,
    );
  });
  return done();
}

/** Ties may name people directly or (as some drawing libraries leave them) as `{ "id": ... }`. */
function endpoint(v: Json): Json {
  return isObject(v) && v['id'] !== undefined ? v['id'] : v;
}

function isObject(v: Json | undefined): v is { [key: string]: Json } {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function textOrUndefined(v: Json | undefined): string | undefined {
  if (typeof v === 'string') return v;
  if (typeof v === 'number') return String(v);
  return undefined;
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
