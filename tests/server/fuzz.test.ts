import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import seedrandom from 'seedrandom';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import type { Reply, TestClient } from '../support/http-client';
import { createPathRoom, upload } from './rooms-helpers';
import { newWorkshop } from './workshops-support';
import { itemAt } from '../../shared/checked';
import { isErrorCode } from '../../shared/api/errors';

/**
 * 2,600 malformed requests and hostile uploads across the API (wrong types, huge strings, deep
 * nesting, NUL, 1e308, bad ids, broken JSON, wrong content types), from a fixed seed: not one
 * may answer 5xx. Destructive routes get bad ids only, so the fixtures stay in place.
 */
const TOTAL = 2600;
const rng = seedrandom('ripplehall-fuzz-1');
const pick = <T>(xs: readonly T[]): T => itemAt(xs, Math.floor(rng() * xs.length), 'fuzz choice');

const deep = (levels: number): unknown => {
  let v: unknown = 1;
  for (let i = 0; i < levels; i++) v = rng() < 0.5 ? [v] : { a: v };
  return v;
};
const VALUES: (() => unknown)[] = [
  () => null,
  () => true,
  () => -1,
  () => 0,
  () => 1e308,
  () => -1e308,
  () => 2 ** 53 + 1,
  () => 0.1,
  () => '',
  () => '\u0000',
  () => 'a\u0000b',
  () => 'x'.repeat(100_000),
  () => '\ud800',
  () => '0x1',
  () => '1e3',
  () => '../../etc/passwd',
  () => '<script>alert(1)</script>',
  () => '%00',
  () => [],
  () => [1, 'two', null],
  () => ({}),
  () => ({ __proto__: { admin: true } }),
  () => deep(2000),
  () => Array.from({ length: 3000 }, () => 'y'),
];
const BAD_IDS = ['0x1', '-1', '1e3', '01', 'abc', '1.5', '99999999999999999999', '%00', '%20', 'null', '0', '9007199254740993'];
const FIELDS = [
  'email',
  'password',
  'name',
  'title',
  'version',
  'ops',
  'people',
  'ties',
  'role',
  'token',
  'k',
  'method',
  'seed',
  'to',
  'participantIds',
  'replace',
  'roomId',
  'sessionDate',
  'runs',
  'format',
];

function body(): { raw?: string; json?: unknown; type?: string } {
  const r = rng();
  if (r < 0.1)
    return { raw: pick(['{', '{"a":', '[1,,2]', '\u0000\u0000', 'null', '"str"', '{"a":1}}', '1e309']), type: 'application/json' };
  if (r < 0.15) return { raw: 'a=1&b=2', type: pick(['text/plain', 'application/x-www-form-urlencoded', 'application/xml']) };
  if (r < 0.2) return { json: pick(VALUES)() };
  const o: Record<string, unknown> = {};
  const n = 1 + Math.floor(rng() * 4);
  for (let i = 0; i < n; i++) o[pick(FIELDS)] = pick(VALUES)();
  if (rng() < 0.2) o[`extra${i18()}`] = 1;
  return { json: o };
}
const i18 = () => Math.floor(rng() * 1e6);

function query(): string {
  if (rng() < 0.5) return '';
  const keys = ['page', 'pageSize', 'size', 'sort', 'direction', 'q', 'scope', 'format', 'dryRun', 'group', 'personId', 'ids'];
  const vals = ['-1', '1e308', 'NaN', '', '%00', 'x'.repeat(5000), '0x1', 'asc', 'true', '[]', '__proto__'];
  return '?' + Array.from({ length: 1 + Math.floor(rng() * 3) }, () => `${pick(keys)}=${encodeURIComponent(pick(vals))}`).join('&');
}

interface Fixtures {
  roomId: number;
  workshopId: number;
}
type Route = [method: string, path: (f: Fixtures, id: () => string) => string];
const ROUTES: Route[] = [
  ['POST', () => '/api/auth/sign-in'],
  ['POST', () => '/api/auth/password-reset'],
  ['POST', () => '/api/auth/invitation/check'],
  ['POST', () => '/api/auth/invitation/accept'],
  ['POST', () => '/api/auth/password-reset/complete'],
  ['POST', () => '/api/auth/password'],
  ['GET', () => '/api/rooms'],
  ['POST', () => '/api/rooms'],
  ['GET', (f, id) => `/api/rooms/${rng() < 0.5 ? f.roomId : id()}`],
  ['PATCH', (f, id) => `/api/rooms/${rng() < 0.5 ? f.roomId : id()}`],
  ['DELETE', (_f, id) => `/api/rooms/${id()}`],
  ['POST', (f, id) => `/api/rooms/${rng() < 0.5 ? f.roomId : id()}/edits`],
  ['GET', (f, id) => `/api/rooms/${rng() < 0.7 ? f.roomId : id()}/people`],
  ['GET', (f, id) => `/api/rooms/${rng() < 0.7 ? f.roomId : id()}/ties`],
  ['GET', (f, id) => `/api/rooms/${rng() < 0.5 ? f.roomId : id()}/summary`],
  ['GET', (f, id) => `/api/rooms/${rng() < 0.7 ? f.roomId : id()}/export`],
  ['POST', (f, id) => `/api/rooms/${rng() < 0.5 ? f.roomId : id()}/shares`],
  ['PATCH', (f, id) => `/api/rooms/${f.roomId}/shares/${id()}`],
  ['DELETE', (f, id) => `/api/rooms/${f.roomId}/shares/${id()}`],
  ['POST', (f, id) => `/api/rooms/${rng() < 0.5 ? f.roomId : id()}/plans`],
  ['GET', (f, id) => `/api/rooms/${rng() < 0.5 ? f.roomId : id()}/plans`],
  ['GET', (_f, id) => `/api/plans/${id()}`],
  ['GET', (_f, id) => `/api/plans/${id()}/briefing.csv`],
  ['GET', () => '/api/plans/compare'],
  ['POST', (_f, id) => `/api/plans/${id()}/rehearsals`],
  ['GET', (_f, id) => `/api/rehearsals/${id()}`],
  ['GET', (_f, id) => `/api/rehearsals/${id()}/samples/${id()}`],
  ['GET', (_f, id) => `/api/jobs/${id()}`],
  ['POST', (_f, id) => `/api/jobs/${id()}/cancel`],
  ['GET', () => '/api/workshops'],
  ['POST', () => '/api/workshops'],
  ['GET', (f, id) => `/api/workshops/${rng() < 0.5 ? f.workshopId : id()}`],
  ['PATCH', (f, id) => `/api/workshops/${rng() < 0.5 ? f.workshopId : id()}`],
  ['POST', (f, id) => `/api/workshops/${rng() < 0.5 ? f.workshopId : id()}/participants`],
  ['POST', (f, id) => `/api/workshops/${rng() < 0.5 ? f.workshopId : id()}/participants/roster`],
  ['DELETE', (f, id) => `/api/workshops/${f.workshopId}/participants/${id()}`],
  ['POST', (f, id) => `/api/workshops/${f.workshopId}/participants/${id()}/reset-claim`],
  ['POST', (f, id) => `/api/workshops/${rng() < 0.5 ? f.workshopId : id()}/links/revoke`],
  ['POST', (f, id) => `/api/workshops/${rng() < 0.5 ? f.workshopId : id()}/status`],
  ['POST', (f, id) => `/api/workshops/${rng() < 0.5 ? f.workshopId : id()}/facilitators`],
  ['POST', (f, id) => `/api/workshops/${rng() < 0.5 ? f.workshopId : id()}/release`],
  ['GET', (_f, id) => `/api/p/${id()}`],
  ['PUT', (_f, id) => `/api/p/${id()}/answers`],
  ['POST', (_f, id) => `/api/p/join/${id()}/claim`],
  ['GET', () => '/api/admin/accounts'],
  ['GET', (_f, id) => `/api/admin/outbox/${id()}`],
  ['POST', () => '/api/admin/invitations'],
  ['PUT', (_f, id) => `/api/admin/accounts/${id()}/role`],
  ['GET', () => '/api/admin/audit'],
];

const UPLOADS: (() => { name: string; content: string | Uint8Array })[] = [
  () => ({ name: 'deep.json', content: '['.repeat(200_000) }),
  () => ({ name: 'deep.graphml', content: '<graphml>' + '<n>'.repeat(100_000) }),
  () => ({ name: 'nul.csv', content: 'source,target\n\u0000,\u0000\n' }),
  () => ({ name: 'bin.csv', content: Uint8Array.from({ length: 4096 }, () => Math.floor(rng() * 256)) }),
  () => ({ name: 'huge.csv', content: 'source,target,strength\na,b,1e308\nb,c,-1\nc,d,NaN\n' }),
  () => ({ name: 'x.exe', content: 'MZ' }),
  () => ({ name: 'bad.json', content: '{"nodes":[{"id":null},{"id":{}}],"links":[{"source":1e308}]}' }),
  () => ({ name: 'ent.graphml', content: '<!DOCTYPE x [<!ENTITY a "aaaa">]><graphml>&a;&a;</graphml>' }),
  () => ({ name: 'long.csv', content: 'source,target\n' + 'z'.repeat(200_000) + ',b\n' }),
];

describe('fuzz: malformed requests and hostile uploads', () => {
  let server: TestServer;
  let user: TestClient;
  let admin: TestClient;
  let fixtures: Fixtures;
  before(async () => {
    server = await startTestServer();
    user = (await signedInClient(server)).client;
    admin = (await signedInClient(server, 'admin')).client;
    const room = await createPathRoom(user, 4);
    const workshop = await newWorkshop(user, [{ name: 'Fuzz One' }, { name: 'Fuzz Two' }]);
    fixtures = { roomId: room.id, workshopId: workshop.id };
  });
  after(async () => server.stop());

  it(`answers ${TOTAL} malformed requests without a single 5xx`, async () => {
    const anonymous = server.client();
    const failures: string[] = [];
    const unknownCodes = new Set<string>();
    const statuses = new Map<number, number>();
    let sent = 0;
    const one = async () => {
      const id = () => pick(BAD_IDS);
      const who = pick([user, user, user, admin, anonymous]);
      let label: string;
      let reply: Reply;
      if (rng() < 0.08) {
        const path = rng() < 0.5 ? '/api/rooms/import' + query() : `/api/rooms/${fixtures.roomId}/import${query()}`;
        const field = pick(['file', 'file', 'people', 'other']);
        label = `upload ${path} ${field}`;
        reply = await upload(who, path, { [field]: pick(UPLOADS)() }, rng() < 0.3 ? { version: pick(['x', '-1', '1e308']) } : {});
      } else {
        const [method, path] = pick(ROUTES);
        const url = path(fixtures, id) + query();
        const b = method === 'GET' || method === 'DELETE' ? {} : body();
        label = `${method} ${url.slice(0, 120)}`;
        const init =
          b.raw !== undefined
            ? { headers: { 'content-type': b.type ?? 'application/json' }, raw: b.raw }
            : { headers: {} as Record<string, string> };
        reply = await who.request(method, url, b.json, init);
      }
      const { status } = reply;
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
      if (status >= 500) failures.push(`${status} ${label}`);
      // Every refusal is the one envelope with a known code (shared/api/errors.ts).
      const code: unknown = (reply.body as { error?: { code?: unknown } } | null)?.error?.code;
      if (status >= 400 && !isErrorCode(code)) unknownCodes.add(`${status} ${String(code)} ${label}`);
    };
    const lanes = Array.from({ length: 6 }, async () => {
      while (sent < TOTAL) {
        sent++;
        await one();
      }
    });
    await Promise.all(lanes);
    const summary = [...statuses]
      .sort(([a], [b]) => a - b)
      .map(([s, n]) => `${s}x${n}`)
      .join(' ');
    assert.deepEqual(failures, [], `5xx answers (${summary})`);
    assert.deepEqual([...unknownCodes], [], 'error answers without a code from ERROR_CODES');
    assert.ok([...statuses.values()].reduce((a, b) => a + b, 0) >= TOTAL);
  });
});
