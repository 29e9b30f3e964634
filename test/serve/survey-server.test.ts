/**
 * The survey server over HTTP, started by the test on a loopback port:
 * malformed and oversized parameters, path traversal (plain and encoded), a
 * foreign Host header, the token and Origin checks on print, a burst of 1000
 * tile requests answered or shed, and the command's clean stop.
 */
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, rmSync } from 'node:fs';
import { Agent, request } from 'node:http';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startSurvey, type SurveyServer } from '../../src/serve/survey-server.js';
import { surveyBase } from '../../src/serve/tile-service.js';
import { parseSheet } from '../../src/view/sheet.js';
import { CLI, runCli, tempDir } from '../helpers/run-cli.js';

interface Reply {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: Buffer;
}

let server: SurveyServer;
let outDir: string;
const CACHE_BYTES = 512 * 1024;
const MAX_QUEUE = 24;
const agent = new Agent({ keepAlive: false, maxSockets: 250 });

/** One request with the path sent exactly as written and any Host header. */
function send(pathText: string, options: { method?: string; headers?: Record<string, string>; body?: string } = {}): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const req = request(
      { host: '127.0.0.1', port: server.port, path: pathText, method: options.method ?? 'GET', headers: { host: `127.0.0.1:${server.port}`, ...options.headers }, agent },
      (res) => {
        const parts: Buffer[] = [];
        res.on('data', (d: Buffer) => parts.push(d));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(parts) }));
      },
    );
    req.on('error', reject);
    req.end(options.body);
  });
}

/** The one-line JSON error of a refused request. */
function errorOf(r: Reply): string {
  const text = r.body.toString('utf8');
  expect(text.trimEnd().includes('\n'), 'one line').toBe(false);
  expect(r.headers['content-type']).toMatch(/^application\/json/);
  return (JSON.parse(text) as { error: string }).error;
}

const FRAME = 're=-0.75&im=0&span=3&w=640&h=480&level=0&size=16';

beforeAll(async () => {
  outDir = tempDir('quadatlas-survey-out-');
  const base = surveyBase(parseSheet({ iterations: 60, samples: 1 }));
  server = await startSurvey({ host: '127.0.0.1', port: 0, base, outDir, workers: 2, maxQueue: MAX_QUEUE, perClient: 200, cacheBytes: CACHE_BYTES, log: () => {} });
});

afterAll(async () => {
  await server.close();
  agent.destroy();
  rmSync(outDir, { recursive: true, force: true });
});

describe('survey server', () => {
  it('serves the page from its fixed list with a restrictive Content-Security-Policy', async () => {
    for (const p of ['/', '/survey.js', '/decimal.js', '/survey.css', '/mark.svg']) {
      const r = await send(p);
      expect(r.status, p).toBe(200);
      expect(String(r.headers['content-security-policy'])).toContain("default-src 'none'");
      expect(String(r.headers['content-security-policy'])).toContain("script-src 'self'");
      expect(r.headers['x-content-type-options']).toBe('nosniff');
    }
  });

  it('answers path traversal, plain and encoded, with 404 and never a file outside the list', async () => {
    const attempts = [
      '/../package.json',
      '/../../../../etc/passwd',
      '/%2e%2e/package.json',
      '/%2E%2E%2Fpackage.json',
      '/..%2f..%2fetc%2fpasswd',
      '/..%5c..%5cpackage.json',
      '/survey.js/../../package.json',
      '//etc/passwd',
      '/./survey.js',
      '/survey.js%00.html',
      '/%252e%252e/package.json',
      '/page/survey.js',
      '/survey-server.js',
      '/tile/../package.json',
    ];
    for (const p of attempts) {
      const r = await send(p);
      expect(r.status, p).toBe(404);
      expect(errorOf(r)).toMatch(/page's own paths/);
      expect(r.body.toString()).not.toMatch(/"dependencies"|root:x:0/);
    }
  });

  it('refuses a Host header other than the bound address and port (DNS rebinding)', async () => {
    for (const host of ['evil.example', `evil.example:${server.port}`, `127.0.0.1:${server.port + 1}`, `localhost.evil.example:${server.port}`]) {
      const r = await send('/', { headers: { host } });
      expect(r.status, host).toBe(403);
      expect(errorOf(r)).toMatch(/Host/);
    }
    expect((await send('/', { headers: { host: `localhost:${server.port}` } })).status).toBe(200);
  });

  it('needs the run token for tiles, probes and the base sheet', async () => {
    for (const p of [
      `/tile?${FRAME}&tx=0&ty=0`,
      `/tile?${FRAME}&tx=0&ty=0&t=${'0'.repeat(32)}`,
      '/probe?c=0,0',
      '/julia?c=0,0&size=64',
      '/strip?re0=-2&re1=0&w=100&h=50',
      `/base?t=${server.token.slice(1)}`,
    ]) {
      const r = await send(p);
      expect(r.status, p).toBe(403);
      expect(errorOf(r)).toMatch(/token/);
    }
  });

  it('answers malformed and oversized parameters with 400 and a one-line error naming the field', async () => {
    const t = `t=${server.token}`;
    const long = `0.${'1'.repeat(600)}`;
    const cases: Array<[string, string]> = [
      [`/tile?${FRAME.replace('re=-0.75', 're=abc')}&tx=0&ty=0&${t}`, 'for re'],
      [`/tile?${FRAME.replace('re=-0.75', `re=${long}`)}&tx=0&ty=0&${t}`, 'at most 420 characters for re'],
      [`/tile?${FRAME.replace('re=-0.75', 're=5')}&tx=0&ty=0&${t}`, 'between -4 and 4 for re'],
      [`/tile?${FRAME.replace('im=0', 'im=1e99999')}&tx=0&ty=0&${t}`, 'for im'],
      [`/tile?${FRAME.replace('span=3', 'span=0')}&tx=0&ty=0&${t}`, 'positive span'],
      [`/tile?${FRAME.replace('span=3', 'span=-1')}&tx=0&ty=0&${t}`, 'positive span'],
      [`/tile?${FRAME.replace('span=3', 'span=65')}&tx=0&ty=0&${t}`, 'for span'],
      [`/tile?${FRAME.replace('w=640', 'w=641')}&tx=0&ty=0&${t}`, 'even number of pixels'],
      [`/tile?${FRAME.replace('w=640', 'w=99999999999')}&tx=0&ty=0&${t}`, 'for w'],
      [`/tile?${FRAME.replace('level=0', 'level=1.5')}&tx=0&ty=0&${t}`, 'for level'],
      [`/tile?${FRAME.replace('level=0', 'level=9999')}&tx=0&ty=0&${t}`, 'for level'],
      [`/tile?${FRAME.replace('size=16', 'size=4')}&tx=0&ty=0&${t}`, 'for size'],
      [`/tile?${FRAME.replace('size=16', 'size=100000')}&tx=0&ty=0&${t}`, 'for size'],
      [`/tile?${FRAME}&tx=20&ty=0&${t}`, 'for tx'],
      [`/tile?${FRAME}&tx=0&ty=-16&${t}`, 'for ty'],
      [`/tile?${FRAME}&tx=0x1&ty=0&${t}`, 'for tx'],
      [`/tile?${FRAME}&ty=0&${t}`, 'for tx'],
      [`/probe?c=1,2,3&${t}`, 'for c'],
      [`/probe?c=${long},0&${t}`, 'characters for c'],
      [`/probe?c=-0.5,0&digits=1000&${t}`, 'for digits'],
      [`/julia?c=-0.5,0&size=100000&${t}`, 'for size'],
      [`/julia?c=-0.5&size=64&${t}`, 'for c'],
      [`/strip?re0=0&re1=-1&w=100&h=50&${t}`, 'for re1'],
      [`/strip?re0=-1&re1=0&w=100000&h=50&${t}`, 'for w'],
      [`/strip?re0=-1&re1=0&w=100&h=5000&${t}`, 'for h'],
    ];
    for (const [p, wanted] of cases) {
      const r = await send(p);
      expect(r.status, p.slice(0, 120)).toBe(400);
      expect(errorOf(r), p.slice(0, 120)).toContain(wanted);
    }
  });

  it('refuses an overlong request line with 414 and other methods with 405', async () => {
    expect((await send(`/tile?re=${'1'.repeat(5000)}`)).status).toBe(414);
    expect((await send('/', { method: 'DELETE' })).status).toBe(405);
    expect((await send('/print')).status).toBe(405);
  });

  it('probes a point: the period-3 nucleus near -0.1226 + 0.7449i has period 3 and external angles 1/7, 2/7, as the probe command says', async () => {
    const r = await send(`/probe?c=-0.1226,0.7449&t=${server.token}`);
    expect(r.status).toBe(200);
    const j = JSON.parse(r.body.toString()) as { period: number; component: { externalAngles: string[]; nucleus: { re: string } } };
    // Angles 1/7 and 2/7 of the period-3 "rabbit" component: Douady and Hubbard's landing theorem, values from memory.
    expect(j.period).toBe(3);
    expect(j.component.externalAngles).toEqual(['1/7', '2/7']);
    const cli = runCli(['probe', '--json', '--', '-0.1226,0.7449']);
    const fromCli = JSON.parse(cli.stdout) as Record<string, unknown>;
    delete fromCli['juliaCommand'];
    delete fromCli['plateCommand'];
    expect(JSON.parse(r.body.toString())).toEqual(fromCli);
  }, 60_000);

  it('prints only with the token, a matching Origin and a JSON body, into --out-dir under a name it picks', async () => {
    const origin = server.origin;
    const good = JSON.stringify({ re: '-0.75', im: '0', span: '3', width: 32, height: 24, samples: 1 });
    const json = { 'content-type': 'application/json' };
    const refused: Array<[Record<string, string>, string, number]> = [
      [{ ...json, origin }, good, 403],
      [{ ...json, origin, 'x-survey-token': 'nope' }, good, 403],
      [{ ...json, 'x-survey-token': server.token }, good, 403],
      [{ ...json, origin: 'http://evil.example', 'x-survey-token': server.token }, good, 403],
      [{ 'content-type': 'text/plain', origin, 'x-survey-token': server.token }, good, 415],
      [{ ...json, origin, 'x-survey-token': server.token }, JSON.stringify({ re: '-0.75', im: '0', span: '3', width: 32, height: 24, file: '../../etc/x.png' }), 400],
      [{ ...json, origin, 'x-survey-token': server.token }, JSON.stringify({ re: '-0.75', im: '0', span: '3', width: 20000, height: 24 }), 400],
      [{ ...json, origin, 'x-survey-token': server.token }, `{"re":"${'1'.repeat(9000)}"}`, 400],
      [{ ...json, origin, 'x-survey-token': server.token }, '{not json', 400],
      [{ ...json, origin, 'x-survey-token': server.token }, JSON.stringify({ re: -0.75, im: '0', span: '3', width: 32, height: 24 }), 400],
    ];
    for (const [headers, body, status] of refused) {
      const r = await send('/print', { method: 'POST', headers, body });
      expect(r.status, `${JSON.stringify(headers)} ${body.slice(0, 60)}`).toBe(status);
      errorOf(r);
    }
    expect(readdirSync(outDir)).toEqual([]);
    const r = await send('/print', { method: 'POST', headers: { ...json, origin, 'x-survey-token': server.token }, body: good });
    expect(r.status).toBe(200);
    const file = (JSON.parse(r.body.toString()) as { file: string }).file;
    expect(path.dirname(file)).toBe(path.resolve(outDir));
    expect(path.basename(file)).toMatch(/^survey-\d{8}-\d{6}-\d+\.png$/);
    expect(existsSync(file) && existsSync(`${file}.json`)).toBe(true);
  }, 60_000);

  it('answers a burst of 1000 tile requests, each with a tile or a 503, keeps its cache within its bound, and serves on', async () => {
    const before = process.memoryUsage().heapUsed;
    const t = `t=${server.token}`;
    const asks: Promise<Reply>[] = [];
    for (let k = 0; k < 1000; k++) {
      const level = k % 5;
      const tx = (k % 40) - 20;
      const ty = (Math.floor(k / 40) % 30) - 15;
      asks.push(send(`/tile?${FRAME.replace('level=0', `level=${level}`)}&tx=${tx}&ty=${ty}&${t}`));
    }
    const replies = await Promise.all(asks);
    const counts = new Map<number, number>();
    for (const r of replies) counts.set(r.status, (counts.get(r.status) ?? 0) + 1);
    expect([...counts.keys()].sort()).toEqual([200, 503]);
    expect(counts.get(200)!).toBeGreaterThan(MAX_QUEUE);
    for (const r of replies) {
      if (r.status === 200) expect(r.body.subarray(1, 4).toString()).toBe('PNG');
      else expect(errorOf(r)).toMatch(/^busy/);
    }
    // The stated bounds: the tile cache stays within its byte budget and nothing waits afterwards.
    expect(server.tiles.cacheBytes).toBeLessThanOrEqual(CACHE_BYTES);
    expect(server.tiles.queued).toBe(0);
    expect(process.memoryUsage().heapUsed - before).toBeLessThan(256 * 1024 * 1024);
    const after = await send(`/tile?${FRAME}&tx=0&ty=0&${t}`);
    expect(after.status).toBe(200);
  }, 180_000);
});

describe('survey server, one client', () => {
  it('holds one client to its limit of tiles in flight (503 beyond it)', async () => {
    // Slow tiles (a boundary view at 20000 iterations) so that the first two are still rendering when the rest arrive.
    const slow = await startSurvey({
      host: '127.0.0.1',
      port: 0,
      base: surveyBase(parseSheet({ iterations: 20000, samples: 1 })),
      outDir,
      workers: 1,
      perClient: 2,
      log: () => {},
    });
    try {
      const frame = 're=-0.7453&im=0.1127&span=0.002&w=1024&h=1024&level=0&size=256';
      const asks = [];
      for (let k = 0; k < 8; k++) {
        asks.push(
          new Promise<Reply>((resolve, reject) => {
            const req = request(
              {
                host: '127.0.0.1',
                port: slow.port,
                path: `/tile?${frame}&tx=${(k % 4) - 2}&ty=${Math.floor(k / 4) - 2}&t=${slow.token}`,
                headers: { host: `127.0.0.1:${slow.port}` },
                agent,
              },
              (res) => {
                const parts: Buffer[] = [];
                res.on('data', (d: Buffer) => parts.push(d));
                res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(parts) }));
              },
            );
            req.on('error', reject);
            req.end();
          }),
        );
      }
      const replies = await Promise.all(asks);
      const shed = replies.filter((r) => r.status === 503);
      expect(replies.filter((r) => r.status === 200).length).toBeGreaterThanOrEqual(2);
      expect(shed.length).toBeGreaterThan(0);
      for (const r of shed) expect(errorOf(r)).toMatch(/per client/);
      expect(shed.length + replies.filter((r) => r.status === 200).length).toBe(8);
    } finally {
      await slow.close();
    }
  }, 120_000);
});

describe('quadatlas survey', () => {
  it('refuses a host that is not loopback without --allow-remote, and a wildcard, in one line with exit 2', () => {
    for (const args of [
      ['--host', '192.0.2.1'],
      ['--host', '0.0.0.0', '--allow-remote'],
    ]) {
      const r = runCli(['survey', ...args]);
      expect(r.status).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(/for --host/);
    }
  });

  it('prints its address with the token on the first stdout line and stops cleanly on SIGTERM', async () => {
    const child = spawn(process.execPath, [CLI, 'survey', '--workers', '1'], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    const first = await new Promise<string>((resolve) => {
      child.stdout.on('data', (d: Buffer) => {
        out += d.toString();
        if (out.includes('\n')) resolve(out.split('\n')[0]!);
      });
    });
    expect(first).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/\?t=[0-9a-f]{32}$/);
    const page = await fetch(first);
    expect(page.status).toBe(200);
    const code = await new Promise<number | null>((resolve) => {
      child.on('exit', (c) => resolve(c));
      child.kill('SIGTERM');
    });
    expect(code).toBe(0);
  }, 30_000);
});
