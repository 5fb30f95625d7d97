import assert from 'node:assert/strict';
import { mkdirSync, mkdtempSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import type { TestServer } from '../support/test-server';

/**
 * A participant's page drawn on the server: the renderer that `ng build` puts beside the browser
 * files (dist/…/server/server.mjs) gets the page's address and its first state, and what it draws
 * is what the phone receives (nonce-stamped, with the state block and the route's code linked).
 * Whenever it cannot draw (fails, is too slow, declines), the phone gets the page drawn in the
 * browser, as before, never an error.
 *
 * The build here is a stand-in with the real build's layout; its renderer writes the greeting
 * from the state it is handed and behaves as the workshop's title asks (fail, slow, decline).
 */
const build = mkdtempSync(join(tmpdir(), 'rh-build-'));
const client = join(build, 'browser');
mkdirSync(client);
mkdirSync(join(build, 'server'));
writeFileSync(
  join(client, 'index.csr.html'),
  '<!doctype html><html><head><link rel="stylesheet" href="styles-AAAA1111.css"></head><body><app-root></app-root>' +
    '<script src="main-MAIN1111.js" type="module"></script></body></html>',
);
writeFileSync(join(client, 'styles-AAAA1111.css'), 'body{margin:0}');
writeFileSync(join(client, 'main-MAIN1111.js'), 'const r=[{path:"p/:token",loadComponent:()=>import("./chunk-ROUTE111.js")}];');
writeFileSync(join(client, 'chunk-ROUTE111.js'), 'export const b=2;');
writeFileSync(
  join(build, 'server', 'server.mjs'),
  `globalThis.renderCalls = [];
export async function renderPage(url, context) {
  globalThis.renderCalls.push({ url, context });
  const title = context.firstState.workshopTitle;
  if (title === 'Renderer fails') throw new Error('broken render');
  if (title === 'Renderer declines') return null;
  if (title === 'Renderer is slow') await new Promise((r) => setTimeout(r, 4000));
  return '<!doctype html><html><head><link rel="stylesheet" href="styles-AAAA1111.css"><style>h1{}</style></head>' +
    '<body><app-root ng-server-context="ssr"><h1>Hello, ' + context.firstState.me.name + '</h1></app-root>' +
    '<script src="main-MAIN1111.js" type="module"></script><link rel="modulepreload" href="chunk-DRAWN111.js"></body></html>';
}
`,
);
process.env['CLIENT_DIR'] = client;

type Call = { url: string; context: { path: string; firstState: { me: { name: string } } } };
const calls = () => (globalThis as unknown as { renderCalls?: Call[] }).renderCalls ?? [];
const stateBlock = (html: string) => /<script type="application\/json" id="rh-first-state">([^<]*)<\/script>/.exec(html)?.[1];

describe('a participant page drawn on the server', () => {
  let server: TestServer;
  let linkFor: (title: string) => Promise<string>;
  before(async () => {
    // Imported only now: the server reads CLIENT_DIR when it loads.
    const ts = await import('../support/test-server');
    const { collectingLinkFor } = await import('./workshops-support');
    server = await ts.startTestServer();
    linkFor = (title) => collectingLinkFor(server, title);
  });
  after(async () => server.stop());

  it('sends what the renderer drew from the link state, stamped with the nonce, with the state block, its stylesheet written in and the route code started after the first frame', async () => {
    const token = await linkFor('Harbour tour briefing');
    const page = await fetch(`${server.url}/p/${token}`);
    assert.equal(page.status, 200);
    const html = await page.text();
    assert.match(html, /<h1>Hello, Mira Tollan<\/h1>/);
    const call = calls().at(-1)!;
    assert.equal(call.url, `http://localhost/p/${token}`, 'drawn for its own address, never the Host header');
    const api = await server.client().get(`/api/p/${token}`);
    assert.deepEqual(call.context, { path: `/p/${token}`, firstState: api.body }, 'drawn from what GET /api/p/<token> answers');
    assert.deepEqual(JSON.parse(stateBlock(html)!), api.body, 'the app starts from the same state');
    const nonce = /'nonce-([^']+)'/.exec(page.headers.get('content-security-policy') ?? '')?.[1];
    assert.ok(nonce);
    assert.ok(html.includes(`<app-root ngCspNonce="${nonce}" ng-server-context="ssr">`), 'the app root carries the nonce');
    assert.ok(html.includes(`<style nonce="${nonce}">`), 'the drawn styles carry the nonce');
    assert.ok(html.includes(`<style nonce="${nonce}">body{margin:0}</style>`), 'the stylesheet is written in, with the nonce');
    assert.ok(!html.includes('<link rel="stylesheet"'), 'no stylesheet request stands before the first paint');
    assert.ok(!html.includes('modulepreload'), 'no code is compiled before the first paint');
    assert.ok(
      html.includes(
        '<script src="paint-first.js?main=main-MAIN1111.js&amp;code=chunk-DRAWN111.js,chunk-ROUTE111.js" type="module"></script>',
      ),
      'the app, the code the page linked and the route code are asked for after the first paint',
    );
    assert.ok(
      page.headers.getSetCookie().some((c) => c.startsWith('XSRF-TOKEN=')),
      'the form token is set',
    );
  });

  it('a render given up on still counts until it ends: four slow ones leave the next page to the browser until they are done', async () => {
    const good = await linkFor('Harbour tour briefing');
    const slow = await linkFor('Renderer is slow');
    const drawn = async () => (await (await fetch(`${server.url}/p/${good}`)).text()).includes('Hello, Mira Tollan');
    assert.ok(await drawn(), 'drawn while nothing else is');
    // Each of these is answered with the browser's page after 1.5 s; its render goes on to 4 s.
    const pages = await Promise.all([1, 2, 3, 4].map(async () => (await fetch(`${server.url}/p/${slow}`)).text()));
    assert.ok(
      pages.every((html) => !html.includes('Hello,')),
      'the slow ones were answered without their drawing',
    );
    const asked = calls().length;
    assert.equal(await drawn(), false, 'four renders still run: the next page is drawn in the browser');
    assert.equal(calls().length, asked, 'and the renderer was not asked');
    let again = false;
    for (let i = 0; i < 40 && !again; i++) {
      await new Promise((r) => setTimeout(r, 250));
      again = await drawn();
    }
    assert.ok(again, 'drawn on the server again once they have ended');
  });

  for (const title of ['Renderer fails', 'Renderer declines', 'Renderer is slow']) {
    it(`falls back to the page drawn in the browser when the renderer ${title.split(' ').slice(1).join(' ')}`, async () => {
      const token = await linkFor(title);
      const before = calls().length;
      const page = await fetch(`${server.url}/p/${token}`);
      assert.equal(page.status, 200);
      const html = await page.text();
      assert.equal(calls().length, before + 1, 'the renderer was asked');
      assert.ok(!html.includes('Hello,'), 'not the drawn page');
      assert.ok(html.includes('<script src="main-MAIN1111.js" type="module">'), 'the app, drawn in the browser');
      assert.equal(JSON.parse(stateBlock(html)!).me.name, 'Mira Tollan', 'with its first state');
    });
  }

  it('a link that does not work is not drawn (the page asks the API, which explains)', async () => {
    const before = calls().length;
    const html = await (await fetch(`${server.url}/p/${'x'.repeat(43)}`)).text();
    assert.equal(calls().length, before, 'the renderer was not asked');
    assert.equal(stateBlock(html), undefined);
    assert.ok(html.includes('<app-root'), 'the plain page');
  });
  it('a build that replaces the renderer while the server runs is not loaded: pages are then drawn in the browser, never broken', async () => {
    const token = await linkFor('Harbour tour briefing');
    const page = async () => (await fetch(`${server.url}/p/${token}`)).text();
    assert.match(await page(), /Hello, Mira Tollan/, 'drawn before');
    const later = new Date(Date.now() + 60_000);
    utimesSync(join(build, 'server', 'server.mjs'), later, later);
    // The build on disk is looked at once a second.
    await new Promise((r) => setTimeout(r, 1100));
    const before = calls().length;
    const html = await page();
    assert.equal(calls().length, before, 'the old renderer is not asked');
    assert.ok(!html.includes('Hello,'), 'not drawn on the server');
    assert.ok(html.includes('<script src="main-MAIN1111.js" type="module">'), 'the app, drawn in the browser');
    assert.equal(JSON.parse(stateBlock(html)!).me.name, 'Mira Tollan', 'with its first state');
  });
});
