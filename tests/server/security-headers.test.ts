/**
 * API answers carry a copy of helmet's security headers made once at start-up
 * (apiSecurityHeaders in server/app.ts). The reference is helmet itself run on each real
 * request with the same policy: the copy must give the same headers, same names as spelled on
 * the wire, same values, same order, with and without HTTPS, and the app's API answers must
 * carry exactly those plus the app's own.
 */
import assert from 'node:assert/strict';
import { createServer, get, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { after, before, describe, it } from 'node:test';
import { apiSecurityHeaders, securityHeaders } from '../../server/app';
import { startTestServer, type TestServer } from '../support/test-server';

type Middleware = (req: IncomingMessage, res: ServerResponse, next: (err?: unknown) => void) => void;

/** What Node adds to every answer, whatever the middleware did. */
const TRANSPORT = new Set(['date', 'connection', 'keep-alive', 'content-length', 'transfer-encoding']);

/** Name/value pairs of an answer as sent (rawHeaders keeps the spelling and order on the wire). */
function rawHeaders(url: string): Promise<[string, string][]> {
  return new Promise((resolve, reject) => {
    get(url, (res) => {
      res.resume();
      const pairs: [string, string][] = [];
      for (let i = 0; i < res.rawHeaders.length; i += 2) pairs.push([res.rawHeaders[i]!, res.rawHeaders[i + 1]!]);
      res.on('end', () => resolve(pairs));
    }).on('error', reject);
  });
}

/** The headers one middleware sets on a real request to a bare server, transport headers left out. */
async function headersOf(middleware: Middleware): Promise<[string, string][]> {
  const server = createServer((req, res) => middleware(req, res, () => res.end('ok')));
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  try {
    const { port } = server.address() as AddressInfo;
    const pairs = await rawHeaders(`http://127.0.0.1:${port}/api/anything?x=1`);
    return pairs.filter(([name]) => !TRANSPORT.has(name.toLowerCase()));
  } finally {
    await new Promise((resolve) => server.close(resolve));
  }
}

describe('security headers of API answers', () => {
  for (const secure of [false, true]) {
    it(`the start-up copy sets what helmet sets on each request (${secure ? 'HTTPS' : 'plain HTTP'})`, async () => {
      const helmetEach = await headersOf(securityHeaders(secure));
      const copy = await headersOf(apiSecurityHeaders(secure));
      assert.ok(helmetEach.length >= 10, JSON.stringify(helmetEach));
      assert.deepEqual(copy, helmetEach);
      const names = helmetEach.map(([n]) => n.toLowerCase());
      assert.equal(names.includes('strict-transport-security'), secure);
      const csp = helmetEach.find(([n]) => n.toLowerCase() === 'content-security-policy')?.[1] ?? '';
      assert.equal(csp.includes('upgrade-insecure-requests'), secure);
      assert.doesNotMatch(csp, /nonce/);
    });
  }

  describe('on the app', () => {
    let server: TestServer;
    before(async () => {
      server = await startTestServer();
    });
    after(async () => {
      await server.stop();
    });

    it("an API answer carries helmet's headers, as helmet spells them, and otherwise only the app's own", async () => {
      const helmetEach = await headersOf(securityHeaders(false));
      const answer = (await rawHeaders(`${server.url}/api/health`)).filter(([name]) => !TRANSPORT.has(name.toLowerCase()));
      const own = new Set(['cache-control', 'content-type', 'x-request-id', 'set-cookie']);
      assert.deepEqual(
        answer.filter(([name]) => !own.has(name.toLowerCase())),
        helmetEach,
      );
      assert.ok(!answer.some(([name]) => name.toLowerCase() === 'x-powered-by'));
    });
  });
});
