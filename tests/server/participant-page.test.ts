import assert from 'node:assert/strict';
import { randomBytes } from 'node:crypto';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import type { TestServer } from '../support/test-server';

/**
 * A participant's page served cold: the chunks it runs are announced in <head> (however deep
 * they are imported), its first survey state is written into the page (safely, whatever the
 * workshop's title), it may write at once, and hashed files are cached for good.
 *
 * The client here is a small stand-in build with the real build's shape: main-*.js names the
 * route's lazy chunk, chunks import chunks.
 */
const client = mkdtempSync(join(tmpdir(), 'rh-client-'));
mkdirSync(join(client, 'media'));
writeFileSync(
  join(client, 'index.html'),
  '<!doctype html><html><head><link rel="stylesheet" href="styles-AAAA1111.css"></head><body><app-root></app-root>' +
    '<link rel="modulepreload" href="chunk-SHARED11.js"><script src="main-MAIN1111.js" type="module"></script></body></html>',
);
writeFileSync(
  join(client, 'main-MAIN1111.js'),
  'import{a}from"./chunk-SHARED11.js";const r=[{path:"p/:token",loadComponent:()=>import("./chunk-ROUTE111.js")},' +
    '{path:"replay/:rehearsalId",canActivate:[g],data:{bare:!0},loadComponent:()=>import("./chunk-REPLAY11.js")}];',
);
writeFileSync(join(client, 'chunk-SHARED11.js'), 'import"./chunk-DEEP1111.js";export const a=1;');
writeFileSync(join(client, 'chunk-ROUTE111.js'), 'import{b}from"./chunk-LEVEL111.js";import{a}from"./chunk-SHARED11.js";');
writeFileSync(join(client, 'chunk-LEVEL111.js'), 'import"./chunk-LEVEL222.js";export const b=2;');
writeFileSync(join(client, 'chunk-LEVEL222.js'), 'export const c=3;');
writeFileSync(join(client, 'chunk-DEEP1111.js'), 'export const d=4;');
writeFileSync(join(client, 'chunk-REPLAY11.js'), 'import{b}from"./chunk-LEVEL111.js";');
writeFileSync(join(client, 'chunk-ELSE1111.js'), 'export const e=5;');
writeFileSync(join(client, 'styles-AAAA1111.css'), 'body{}');
writeFileSync(join(client, 'media', 'font-BBBB2222.woff2'), 'font');
writeFileSync(join(client, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
process.env['CLIENT_DIR'] = client;

const firstState = (html: string) => {
  const m = /<script type="application\/json" id="rh-first-state">([^<]*)<\/script>/.exec(html);
  return m ? (JSON.parse(m[1]!) as { workshopTitle: string; me: { name: string }; names: unknown[]; consented: boolean }) : null;
};

describe('a participant page served cold', () => {
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

  it('carries the survey state the API would answer, and the form token to answer with at once', async () => {
    const token = await linkFor('Harbour tour briefing');
    const phone = server.client();
    const page = await fetch(`${server.url}/p/${token}`);
    assert.equal(page.status, 200);
    assert.equal(page.headers.get('cache-control'), 'no-store');
    const html = await page.text();
    const state = firstState(html);
    assert.ok(state, 'the page has its first state');
    const api = await server.client().get(`/api/p/${token}`);
    assert.deepEqual(state, api.body, 'the same state as GET /api/p/<token>');
    assert.equal(state.me.name, 'Mira Tollan');

    // No API call before the first write: the page's own cookie is the form token.
    const cookie = page.headers.getSetCookie().find((c) => c.startsWith('XSRF-TOKEN='));
    assert.ok(cookie, 'the page sets the form token');
    phone.cookies.set('XSRF-TOKEN', cookie.split(';')[0]!.slice('XSRF-TOKEN='.length));
    const consent = await phone.post(`/api/p/${token}/consent`);
    assert.equal(consent.status, 200, consent.text);
    assert.equal(consent.body.consented, true);
  });

  it('keeps a hostile workshop title inert and exact', async () => {
    const title = "Q3 </script><script>alert(1)</script> & $& $' <!--";
    const token = await linkFor(title);
    const html = await (await fetch(`${server.url}/p/${token}`)).text();
    assert.equal(html.match(/<script/g)?.length, 2, 'only the data block and the app script');
    assert.equal(firstState(html)?.workshopTitle, title);
  });

  it('a link that does not work gets the page without data (the page then asks the API)', async () => {
    const page = await fetch(`${server.url}/p/${'x'.repeat(43)}`);
    assert.equal(page.status, 200);
    assert.equal(firstState(await page.text()), null);
  });

  it('announces every chunk the page runs, however deep, and only those', async () => {
    const token = await linkFor('Preload check');
    const html = await (await fetch(`${server.url}/p/${token}`)).text();
    const head = html.slice(0, html.indexOf('</head>'));
    const preloaded = [...head.matchAll(/rel="modulepreload" href="([^"]+)"/g)].map((m) => m[1]).sort();
    assert.deepEqual(preloaded, ['chunk-DEEP1111.js', 'chunk-LEVEL111.js', 'chunk-LEVEL222.js', 'chunk-ROUTE111.js']);
    const other = await (await fetch(`${server.url}/rooms`)).text();
    assert.ok(!other.includes('chunk-ROUTE111.js'), 'other pages are served as built');
    assert.equal(firstState(other), null);
  });

  it('the projector replay, opened cold, announces its own chunks (and carries no survey state)', async () => {
    const html = await (await fetch(`${server.url}/replay/12`)).text();
    const head = html.slice(0, html.indexOf('</head>'));
    const preloaded = [...head.matchAll(/rel="modulepreload" href="([^"]+)"/g)].map((m) => m[1]).sort();
    // chunk-DEEP1111.js: main-*.js imports it through chunk-SHARED11.js, which index.html links already.
    assert.deepEqual(preloaded, ['chunk-DEEP1111.js', 'chunk-LEVEL111.js', 'chunk-LEVEL222.js', 'chunk-REPLAY11.js']);
    assert.equal(firstState(html), null);
    const elsewhere = await (await fetch(`${server.url}/replay/12/more`)).text();
    assert.ok(!elsewhere.includes('chunk-REPLAY11.js'), 'only the replay address itself');
  });

  it('caches hashed files for good and the rest for an hour', async () => {
    for (const path of ['/chunk-ROUTE111.js', '/styles-AAAA1111.css', '/media/font-BBBB2222.woff2']) {
      const res = await fetch(`${server.url}${path}`);
      assert.equal(res.status, 200, path);
      assert.equal(res.headers.get('cache-control'), 'public, max-age=31536000, immutable', path);
    }
    assert.equal((await fetch(`${server.url}/favicon.svg`)).headers.get('cache-control'), 'public, max-age=3600');
  });

  // Last: it uses up this address's allowance of links that do not work.
  it('a page with a link that does not work counts against the guessing limit, like the API', async () => {
    const { config } = await import('../../server/config');
    const token = await linkFor('Guessing check');
    const guess = () => randomBytes(32).toString('base64url');
    for (let i = 0; i < config.RATE_LIMIT_LINK_PER_15MIN; i++) {
      const page = await fetch(`${server.url}/p/${guess()}`);
      assert.equal(firstState(await page.text()), null, `guess ${i}`);
    }
    assert.equal((await server.client().get(`/api/p/${guess()}`)).status, 429, 'the page guesses used up the allowance');
    assert.ok(firstState(await (await fetch(`${server.url}/p/${token}`)).text()), 'a good link still gets its page');
  });
});
