import { createServer, type Server } from 'node:http';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, normalize } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type Browser } from 'playwright-core';
import { voronoi, writeMeshJSON } from '../../src/index.js';

// The built ESM bundle (dist/index.js, made by the test command's tsup step) in headless Chromium, Debian's
// package. CI installs it (.ci/run) and must run this test; elsewhere a missing browser skips it, saying why.
const CHROMIUM = '/usr/bin/chromium';
const haveBrowser = existsSync(CHROMIUM);
if (!haveBrowser && process.env.CI) throw new Error(`CI needs Debian's chromium at ${CHROMIUM} for the browser test (apt-get install chromium)`);
const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

// Served files: the bundle and its two runtime dependencies, mapped to their bare names by an import map.
const page = `<!doctype html><meta charset="utf-8"><title>ambit in a browser</title>
<script type="importmap">{ "imports": {
  "robust-predicates": "/node_modules/robust-predicates/index.js",
  "tinyqueue": "/node_modules/tinyqueue/index.js" } }</script>
<script type="module">
  import * as ambit from '/dist/index.js';
  window.ambit = ambit;
  window.ready = true;
</script>`;

const sites: [number, number][] = Array.from({ length: 300 }, (_, i): [number, number] => [Math.cos(i * 2.399963) * Math.sqrt(i), Math.sin(i * 2.399963) * Math.sqrt(i)]);

let server: Server;
let browser: Browser;
let origin = '';

describe.skipIf(!haveBrowser)(`in headless Chromium${haveBrowser ? '' : ' (skipped: no browser at ' + CHROMIUM + ')'}`, () => {
  beforeAll(async () => {
    server = createServer((req, res) => {
      const path = normalize(decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname));
      if (path === '/') { res.writeHead(200, { 'content-type': 'text/html' }).end(page); return; }
      if (!/^\/(dist|node_modules\/robust-predicates|node_modules\/tinyqueue)\//.test(path)) { res.writeHead(404).end(); return; }
      const file = join(root, path);
      if (!existsSync(file)) { res.writeHead(404).end(); return; }
      res.writeHead(200, { 'content-type': 'text/javascript' }).end(readFileSync(file));
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const address = server.address();
    origin = `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}`;
    // --no-sandbox: CI runs as root, where Chromium's sandbox refuses to start.
    browser = await chromium.launch({ executablePath: CHROMIUM, args: ['--no-sandbox'] });
  });

  afterAll(async () => {
    await browser?.close();
    await new Promise((resolve) => server?.close(resolve));
  });

  it('builds the same Voronoi diagram as Node, byte for byte, with the same measures and queries', async () => {
    const tab = await browser.newPage();
    const errors: string[] = [];
    tab.on('pageerror', (e) => errors.push(String(e)));
    await tab.goto(origin + '/');
    await tab.waitForFunction(() => (globalThis as unknown as { ready?: boolean }).ready === true, undefined, { timeout: 30_000 });
    const there = await tab.evaluate((pts) => {
      const g = globalThis as unknown as { ambit: typeof import('../../src/index.js'); navigator: { userAgent: string } };
      const a = g.ambit;
      const d = a.voronoi(pts);
      return { mesh: a.writeMeshJSON(d.mesh), areas: Array.from(d.cellAreas()), nearest: d.nearest(0.3, -0.7), userAgent: g.navigator.userAgent };
    }, sites);
    const d = voronoi(sites);
    expect(errors).toEqual([]);
    expect(there.userAgent).toMatch(/Chrome/);
    expect(there.mesh).toBe(writeMeshJSON(d.mesh));
    expect(there.areas).toEqual(Array.from(d.cellAreas()));
    expect(there.nearest).toBe(d.nearest(0.3, -0.7));
    await tab.close();
  });
});
