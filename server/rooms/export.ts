/**
 * Export with the engine's writers: node-link JSON (plus Ripplehall's layout and settings, which
 * other tools ignore), GraphML, and people / ties CSV (cells protected against formula
 * injection by the engine's CSV writer; a UTF-8 byte-order mark so spreadsheets read accents).
 * E-mail addresses are not exported: files travel, and the map does not need them.
 */
import { writeGraphml, writeNodeLink, writeRoomCsv } from '../../shared/engine/index';
import type { ExportFormat } from '../../shared/api/rooms';
import type { LoadedRoomGraph } from './access';
import type { PersonDto } from '../../shared/api/rooms';

export interface ExportFile {
  filename: string;
  contentType: string;
  body: string;
}

/** A file name from the room name: letters, digits and dashes only. */
export function fileStem(name: string): string {
  const stem = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return stem || 'room';
}

export function exportRoom(format: ExportFormat, roomName: string, loaded: LoadedRoomGraph, people: PersonDto[]): ExportFile {
  const stem = fileStem(roomName);
  const { graph, settings } = loaded;
  switch (format) {
    case 'json': {
      const doc = JSON.parse(writeNodeLink(graph)) as { directed: boolean; nodes: Record<string, unknown>[]; links: unknown[] };
      const byKey = new Map(people.map((p) => [p.key, p]));
      for (const node of doc.nodes) {
        const p = byKey.get(node['id'] as string);
        if (p && p.x !== null && p.y !== null) Object.assign(node, { x: p.x, y: p.y, pinned: p.pinned });
      }
      const out = {
        directed: doc.directed,
        graph: { name: roomName, minutesPerHop: settings.minutesPerHop, laziness: settings.laziness, mixing: settings.mixing },
        nodes: doc.nodes,
        links: doc.links,
      };
      return { filename: `${stem}.json`, contentType: 'application/json; charset=utf-8', body: JSON.stringify(out, null, 1) + '\n' };
    }
    case 'graphml':
      return { filename: `${stem}.graphml`, contentType: 'application/graphml+xml; charset=utf-8', body: writeGraphml(graph) };
    case 'people-csv':
      return { filename: `${stem}-people.csv`, contentType: 'text/csv; charset=utf-8', body: '\uFEFF' + writeRoomCsv(graph).people };
    case 'ties-csv':
      return { filename: `${stem}-ties.csv`, contentType: 'text/csv; charset=utf-8', body: '\uFEFF' + writeRoomCsv(graph).ties };
    case 'org-chart-csv':
      throw new Error('The org-chart CSV is written from the people rows (routes.ts), not from the graph.');
  }
}
