/**
 * Compressed and cached (#18 item 4), against the app as `npm start` serves it (the e2e setup builds
 * the client for production): static files go out as the brotli or gzip copy made at build time
 * (a fixed Content-Length: nothing is compressed on the fly outside /api), hashed files with a year's
 * immutable cache and the HTML shell revalidated; API JSON above 1 KB is compressed and a smaller
 * answer is not; /robots.txt is a real text file; and a visitor who never signed in makes no request
 * that answers 401. Encodings and headers by RFC 9110 (§8.4 Content-Encoding, §8.6 Content-Length) and
 * RFC 9111 §5.2 (Cache-Control), `immutable` by RFC 8246.
 */
import http from 'node:http';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { describe, expect, it, inject } from 'vitest';
import { DEMO, startE2eFile } from '../support/e2e';
import { authHeader, signIn } from '../support/auth';
import { SurveyListResponseSchema } from '@shared/schemas/sync';

const baseUrl = inject('baseUrl');

/** One GET with the bytes exactly as sent (Node's fetch would undo the compression). */
function rawGet(path: string, headers: Record<string, string> = {}): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    http
      .get(`${baseUrl}${path}`, { headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
        res.on('error', reject);
      })
      .on('error', reject);
  });
}

const e2e = startE2eFile();

describe('static files', () => {
  it('a hashed script goes out pre-compressed, brotli first, gzip for a browser without it, cached for a year', async () => {
    const shell = await rawGet('/sign-in');
    const script = /src="(\/assets\/[^"]+\.js)"/.exec(shell.body.toString('utf8'))?.[1];
    expect(script, 'the shell names its entry script').toBeTruthy();
    const plain = await rawGet(script!, { 'accept-encoding': 'identity' });
    expect(plain.status).toBe(200);
    expect(plain.headers['content-encoding']).toBeUndefined();

    const br = await rawGet(script!, { 'accept-encoding': 'gzip, deflate, br' });
    expect(br.headers['content-encoding']).toBe('br');
    // a file made beforehand has its length up front; on-the-fly compression would be chunked
    expect(Number(br.headers['content-length'])).toBe(br.body.length);
    expect(br.body.length).toBeLessThan(plain.body.length / 2);
    expect(brotliDecompressSync(br.body).equals(plain.body)).toBe(true);
    expect(br.headers['cache-control']).toMatch(/max-age=31536000/);
    expect(br.headers['cache-control']).toMatch(/immutable/);
    expect(br.headers.vary ?? '').toMatch(/accept-encoding/i);

    const gz = await rawGet(script!, { 'accept-encoding': 'gzip' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(Number(gz.headers['content-length'])).toBe(gz.body.length);
    expect(gunzipSync(gz.body).equals(plain.body)).toBe(true);
  });

  it('the HTML shell and the service worker are revalidated on every visit, never kept a year', async () => {
    for (const path of ['/sign-in', '/sw.js']) {
      const res = await rawGet(path, { 'accept-encoding': 'br' });
      expect([path, res.status]).toEqual([path, 200]);
      expect(res.headers['cache-control'], path).toBe('no-cache');
    }
  });

  it('/robots.txt is a text file, not the app', async () => {
    const res = await rawGet('/robots.txt', { 'accept-encoding': 'identity' });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    const text = res.body.toString('utf8');
    expect(text).toMatch(/^User-agent: \*/m);
    expect(text).toMatch(/^Disallow: \/api\//m);
    expect(text.toLowerCase()).not.toContain('<html');
  });
});

describe('API answers', () => {
  it('compresses JSON above 1 KB (a survey) and leaves a small answer (health) as it is', async () => {
    const { accessToken } = await signIn(baseUrl, DEMO.surveyor.email, DEMO.surveyor.password);
    const list = SurveyListResponseSchema.parse(await (await fetch(`${baseUrl}/api/surveys`, { headers: authHeader(accessToken) })).json());
    const id = list.items[0]?.id;
    expect(id).toBeTruthy();
    const big = await rawGet(`/api/surveys/${id}`, { ...authHeader(accessToken), 'accept-encoding': 'gzip, br' });
    expect(big.status).toBe(200);
    expect(['br', 'gzip']).toContain(big.headers['content-encoding']);
    const json = big.headers['content-encoding'] === 'br' ? brotliDecompressSync(big.body) : gunzipSync(big.body);
    expect(json.length).toBeGreaterThan(1024);
    expect(big.body.length).toBeLessThan(json.length);
    expect(json.toString('utf8')).toContain(id);

    const small = await rawGet('/api/health', { 'accept-encoding': 'gzip, br' });
    expect(small.body.length).toBeLessThan(1024);
    expect(small.headers['content-encoding']).toBeUndefined();
  });
});

describe('a visitor who never signed in', () => {
  it('opens the app and the sign-in page without a single request answering 401', async () => {
    const context = await e2e.browser.newContext({ viewport: { width: 390, height: 844 } });
    const answers: { url: string; status: number }[] = [];
    context.on('response', (r) => answers.push({ url: r.url(), status: r.status() }));
    try {
      const page = await context.newPage();
      // the landing page, the sign-in page, and a signed-in page (which sends the visitor to sign in)
      const shown = { '/': () => page.getByRole('heading', { level: 1 }), '/sign-in': () => page.getByLabel('E-mail'), '/surveys': () => page.getByLabel('E-mail') };
      for (const [path, mark] of Object.entries(shown)) {
        // not 'networkidle': the service worker's precache keeps the network busy on a first visit
        await page.goto(`${baseUrl}${path}`, { waitUntil: 'load' });
        await mark().waitFor({ timeout: 30_000 });
        // whatever the page asks for once it is shown (session check, sync status) has time to answer
        await page.waitForTimeout(1500);
      }
      expect(answers.length).toBeGreaterThan(0);
      expect(answers.filter((a) => a.status === 401)).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
