import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import express, { Router, type Express } from 'express';
import { createApp } from '../../server/app';
import { policyOf, publicAccess, type AccessPolicy } from '../../server/core/access';
import { signedInClient, startTestServer, type TestServer } from '../support/test-server';
import type { TestClient } from '../support/http-client';

/**
 * Deny by default, checked on the live route table: every API route of createApp(), whoever
 * added it, must start with an access policy, and each role gets the answer its policy promises.
 */
interface RouteEntry {
  method: string;
  path: string;
  policy: AccessPolicy | undefined;
  /** How many handlers of the route carry a policy (must be exactly one, the first). */
  policies: number;
}

interface LayerLike {
  route?: { path: string | string[]; methods: Record<string, boolean>; stack: { handle: unknown }[] };
  handle: { stack?: LayerLike[] };
  rawPath?: string | string[];
}

const join = (prefix: string, path: string) => (prefix + (path === '/' ? '' : path)).replace(/\/{2,}/g, '/') || '/';

export function listRoutes(stack: LayerLike[], prefix = ''): RouteEntry[] {
  const out: RouteEntry[] = [];
  for (const layer of stack) {
    if (layer.route) {
      const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
      const first = layer.route.stack[0]?.handle as { [policyOf]?: AccessPolicy } | undefined;
      const policies = layer.route.stack.filter((l) => (l.handle as { [policyOf]?: AccessPolicy })?.[policyOf]).length;
      for (const p of paths) {
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all')
            out.push({ method: method.toUpperCase(), path: join(prefix, p), policy: first?.[policyOf], policies });
        }
      }
    } else if (layer.handle?.stack) {
      const mount = (Array.isArray(layer.rawPath) ? layer.rawPath[0] : layer.rawPath) ?? '/';
      out.push(...listRoutes(layer.handle.stack, join(prefix, mount)));
    }
  }
  return out;
}

const appRoutes = (app: Express) => listRoutes((app as unknown as { router: { stack: LayerLike[] } }).router.stack);

/** Placeholder values: ids that exist nowhere, link tokens of the right shape that match nothing. */
function concretePath(path: string): string {
  return path
    .replace(/[{}]/g, '')
    .replace(/:(\w*token\w*)/gi, 'x'.repeat(43))
    .replace(/:\w+/g, '999999')
    .replace(/\*\w+/g, 'placeholder');
}

type Who = 'signed-out' | 'facilitator' | 'admin';

/** What the policy promises to a caller; undefined = allowed through (then any non-5xx answer). */
function promised(policy: AccessPolicy, who: Who): 401 | 403 | undefined {
  if (policy.kind !== 'roles') return undefined;
  if (who === 'signed-out') return 401;
  return policy.roles.includes(who) ? undefined : 403;
}

async function call(client: TestClient, method: string, path: string): Promise<number> {
  if (!client.cookies.has('XSRF-TOKEN')) await client.get('/api/auth/me');
  const headers: Record<string, string> = { cookie: client.cookieHeader(), accept: 'application/json' };
  const xsrf = client.cookies.get('XSRF-TOKEN');
  if (method !== 'GET' && xsrf) headers['x-xsrf-token'] = decodeURIComponent(xsrf);
  const body = method === 'GET' || method === 'HEAD' ? undefined : '{}';
  if (body) headers['content-type'] = 'application/json';
  const abort = new AbortController();
  const timer = setTimeout(() => abort.abort(), 8000);
  try {
    const res = await fetch(client.baseUrl + path, { method, headers, body, redirect: 'manual', signal: abort.signal });
    // Event streams stay open: the status line is the answer we need.
    await (res.headers.get('content-type')?.includes('event-stream') ? res.body?.cancel() : res.arrayBuffer());
    return res.status;
  } catch (err) {
    throw new Error(`${method} ${path} did not answer within 8 s (${(err as Error).message})`);
  } finally {
    clearTimeout(timer);
  }
}

describe('route table: every route has an access policy and keeps its promise to each role', () => {
  let server: TestServer;
  let routes: RouteEntry[];
  before(async () => {
    server = await startTestServer();
    routes = appRoutes(createApp());
  });
  after(async () => server.stop());

  it('finds the routes of every feature router, at their full paths', () => {
    const keys = new Set(routes.map((r) => `${r.method} ${r.path}`));
    for (const expected of ['GET /api/health', 'POST /api/auth/sign-in', 'GET /api/admin/accounts', 'GET /api/admin/outbox/:id/html']) {
      assert.ok(keys.has(expected), `${expected} is listed (found ${routes.length} routes)`);
    }
  });

  it('the walker itself flags a route without a policy, also in nested routers', () => {
    const app = express();
    const inner = Router();
    inner.get('/open', (_req, res) => res.end());
    inner.post('/tagged', publicAccess, (_req, res) => res.end());
    const outer = Router();
    outer.use('/inner', inner);
    app.use('/api', outer);
    const found = appRoutes(app);
    assert.deepEqual(
      found.map((r) => [r.method, r.path, r.policy?.kind]),
      [
        ['GET', '/api/inner/open', undefined],
        ['POST', '/api/inner/tagged', 'public'],
      ],
    );
  });

  it('every API route starts with exactly one access policy; outside /api only the client pages', () => {
    const missing = routes.filter((r) => r.path.startsWith('/api') && !r.policy).map((r) => `${r.method} ${r.path}`);
    assert.deepEqual(missing, [], 'routes without an access policy as their first handler');
    const doubled = routes.filter((r) => r.path.startsWith('/api') && r.policies !== 1).map((r) => `${r.method} ${r.path}`);
    assert.deepEqual(doubled, [], 'routes with more than one access policy');
    // The built client (index.html and its SPA fallback) is public by nature and carries no data.
    const outside = routes.filter((r) => !r.path.startsWith('/api')).map((r) => `${r.method} ${r.path}`);
    for (const r of outside) assert.match(r, /^GET \/(\{\*splat\})?$/, `${r} is outside /api`);
  });

  it('called as signed-out (also: a participant without a valid link), facilitator and admin: 401/403 as promised, never 5xx', async () => {
    const clients: Record<Who, TestClient> = {
      'signed-out': server.client(),
      facilitator: (await signedInClient(server, 'facilitator')).client,
      admin: (await signedInClient(server, 'admin')).client,
    };
    const problems: string[] = [];
    let calls = 0;
    for (const route of routes.filter((r) => r.path.startsWith('/api') && r.policy)) {
      const path = concretePath(route.path);
      for (const who of Object.keys(clients) as Who[]) {
        // Signing out would end the shared session of this test: use a throwaway one.
        const client = route.path.endsWith('/sign-out') && who !== 'signed-out' ? (await signedInClient(server, who)).client : clients[who];
        const status = await call(client, route.method, path);
        calls++;
        const want = promised(route.policy!, who);
        const label = `${who.padEnd(11)} ${route.method} ${path} -> ${status}`;
        if (status >= 500) problems.push(`${label} (server error)`);
        else if (want && status !== want) problems.push(`${label} (policy ${JSON.stringify(route.policy)} promises ${want})`);
        else if (!want && route.policy!.kind === 'roles' && status === 401)
          problems.push(`${label} (allowed role was refused as signed out)`);
      }
    }
    assert.deepEqual(problems, [], `${problems.length} of ${calls} calls broke the rules`);
    assert.ok(calls >= 3 * 20, `${calls} calls made`);
    console.log(`route table: ${routes.length} routes, ${calls} calls`);
    // The shared sessions survived the sweep, so every call above really ran as its role.
    assert.equal((await clients.admin.get('/api/auth/me')).body.user.role, 'admin');
    assert.equal((await clients.facilitator.get('/api/auth/me')).body.user.role, 'facilitator');
  });
});
