/**
 * The survey page's HTTP server (node:http): one page from a fixed list of
 * files, tiles on demand, the probe of a point, and prints into one folder.
 *
 * Safety, since a browser on the same machine talks to it:
 * - it binds loopback unless told otherwise (cli/survey.ts asks for
 *   --allow-remote and warns);
 * - a Host header other than the bound address and port is refused (a page
 *   elsewhere that rebinds its DNS name to 127.0.0.1 sends its own name);
 * - every API request needs the per-run token (query `t`, or the
 *   X-Survey-Token header for the print), so a page elsewhere cannot make
 *   the server compute; the print, which writes a file, also needs an Origin
 *   that is this server and a JSON body (no plain form can send one);
 * - no path is ever taken from a request: the page is a fixed map from exact
 *   request paths to files read at start-up, and prints go to the out folder
 *   under a name the server picks;
 * - every parameter is checked (survey-params.ts) and a bad one answered
 *   400 with a one-line JSON error; responses carry a Content-Security-Policy
 *   that allows only this origin's scripts, styles, images and fetches;
 * - work is bounded: the tile queue sheds with 503 past its length, one
 *   client may hold only so many tiles in flight, probes and prints run one
 *   at a time, and request bodies and URLs have a size limit.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { ConvergenceError } from '../check/fields.js';
import { Received, UserError } from '../check/user-error.js';
import { parseDecimalPair } from '../precise/decimal-string.js';
import { renderSheet } from '../render/render-sheet.js';
import { probePoint } from '../section/probe-point.js';
import { renderRecord, type Sheet } from '../view/sheet.js';
import { toolVersion } from '../io/tool-version.js';
import { evenSideParam, decimalParam, integerParam, MAX_PRINT_SIDE, pointParam, spanParam, tileParams } from './survey-params.js';
import { TileService } from './tile-service.js';
import { realStrip } from './real-strip.js';
import { encodePngTile } from '../io/iiif-tile-file.js';
import { QueueFull, Withdrawn } from './tile-pool.js';

export interface SurveyOptions {
  readonly host: string;
  readonly port: number;
  /** The sheet whose colouring, iterations and samples the tiles use. */
  readonly base: Sheet;
  /** Where prints go. */
  readonly outDir: string;
  readonly workers: number;
  /** Tiles waiting for a worker before new ones get 503. */
  readonly maxQueue?: number;
  /** Tile requests one client address may have open at once. */
  readonly perClient?: number;
  /** Byte budget of the tile cache. */
  readonly cacheBytes?: number;
  /** The token (tests); a fresh random one by default. */
  readonly token?: string;
  /** Where the server reports each print and internal error (stderr by default). */
  readonly log?: (line: string) => void;
}

export interface SurveyServer {
  /** The page's address with the token. */
  readonly url: string;
  readonly origin: string;
  readonly token: string;
  readonly port: number;
  readonly tiles: TileService;
  close(): Promise<void>;
}

export const DEFAULT_MAX_QUEUE = 256;
export const DEFAULT_PER_CLIENT = 96;
export const DEFAULT_CACHE_BYTES = 64 * 1024 * 1024;
const MAX_URL = 4096;
const MAX_STRIP_WIDTH = 4096;
const MAX_STRIP_HEIGHT = 400;
const MIN_JULIA_SIZE = 16;
const MAX_JULIA_SIZE = 512;
const MAX_BODY = 8192;

/** The page: exact request path -> file in ./page/ and its type. Nothing else is ever read from disk. */
const PAGE: Readonly<Record<string, readonly [string, string]>> = {
  '/': ['survey.html', 'text/html; charset=utf-8'],
  '/survey.js': ['survey.js', 'text/javascript; charset=utf-8'],
  '/decimal.js': ['decimal.js', 'text/javascript; charset=utf-8'],
  '/survey.css': ['survey.css', 'text/css; charset=utf-8'],
  '/mark.svg': ['mark.svg', 'image/svg+xml'],
};

const CSP = "default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self' blob: data:; connect-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";

function loadPage(): Map<string, { body: Buffer; type: string }> {
  const dir = new URL('./page/', import.meta.url);
  const files = new Map<string, { body: Buffer; type: string }>();
  for (const [route, [file, type]] of Object.entries(PAGE)) files.set(route, { body: readFileSync(new URL(file, dir)), type });
  return files;
}

function isLoopback(host: string): boolean {
  return host === '127.0.0.1' || host === '::1' || host === 'localhost' || /^127\.\d+\.\d+\.\d+$/.test(host);
}

/** The Host header values that name this server. */
function allowedHosts(host: string, port: number): Set<string> {
  const names = new Set<string>([host.includes(':') ? `[${host}]` : host]);
  if (isLoopback(host)) for (const n of ['127.0.0.1', 'localhost', '[::1]']) names.add(n);
  return new Set([...names].map((n) => `${n}:${port}`.toLowerCase()));
}

function sameToken(given: string | null | undefined, token: string): boolean {
  if (typeof given !== 'string' || given.length !== token.length) return false;
  return timingSafeEqual(Buffer.from(given), Buffer.from(token));
}

function send(res: ServerResponse, status: number, type: string, body: Buffer | string, extra: Record<string, string> = {}): void {
  if (res.headersSent || res.destroyed) return;
  res.writeHead(status, {
    'content-type': type,
    'content-length': Buffer.byteLength(body),
    'content-security-policy': CSP,
    'x-content-type-options': 'nosniff',
    'referrer-policy': 'no-referrer',
    'x-frame-options': 'DENY',
    'cross-origin-resource-policy': 'same-origin',
    'cache-control': 'no-store',
    ...extra,
  });
  res.end(body);
}

function sendJson(res: ServerResponse, status: number, value: unknown, extra: Record<string, string> = {}): void {
  send(res, status, 'application/json; charset=utf-8', `${JSON.stringify(value)}\n`, extra);
}

/** A one-line JSON error: { "error": "..." }. */
function fail(res: ServerResponse, status: number, message: string, extra: Record<string, string> = {}): void {
  sendJson(res, status, { error: message.replace(/\s*\n\s*/g, ' ') }, extra);
}

async function readBody(req: IncomingMessage): Promise<string> {
  let size = 0;
  const parts: Buffer[] = [];
  for await (const chunk of req) {
    const b = chunk as Buffer;
    size += b.length;
    if (size > MAX_BODY) throw new UserError('body', `a JSON body of at most ${MAX_BODY} bytes`, `${size}+ bytes`);
    parts.push(b);
  }
  return Buffer.concat(parts).toString('utf8');
}

function stamp(d: Date): string {
  const p = (n: number): string => String(n).padStart(2, '0');
  return `${d.getUTCFullYear()}${p(d.getUTCMonth() + 1)}${p(d.getUTCDate())}-${p(d.getUTCHours())}${p(d.getUTCMinutes())}${p(d.getUTCSeconds())}`;
}

export async function startSurvey(o: SurveyOptions): Promise<SurveyServer> {
  const page = loadPage();
  const token = o.token ?? randomBytes(16).toString('hex');
  const log = o.log ?? ((line: string) => process.stderr.write(`${line}\n`));
  const tiles = new TileService(o.base, { workers: o.workers, maxQueue: o.maxQueue ?? DEFAULT_MAX_QUEUE, cacheBytes: o.cacheBytes ?? DEFAULT_CACHE_BYTES });
  const perClient = o.perClient ?? DEFAULT_PER_CLIENT;
  const open = new Map<string, number>();
  let probing = false;
  let printing = false;
  let prints = 0;
  let hosts = new Set<string>();
  let origins = new Set<string>();

  const handleTile = async (req: IncomingMessage, res: ServerResponse, q: URLSearchParams): Promise<void> => {
    const t = tileParams(q);
    const client = req.socket.remoteAddress ?? '?';
    const mine = open.get(client) ?? 0;
    if (mine >= perClient) {
      fail(res, 503, `busy: at most ${perClient} tiles in flight per client`, { 'retry-after': '1' });
      return;
    }
    open.set(client, mine + 1);
    const gone = new AbortController();
    const onClose = (): void => {
      if (!res.writableEnded) gone.abort();
    };
    res.on('close', onClose);
    try {
      const answer = await tiles.tile(t, gone.signal);
      send(res, 200, 'image/png', answer.png, { 'x-tile-rect': `${answer.rect.x0},${answer.rect.y0},${answer.rect.w},${answer.rect.h}`, 'cache-control': 'private, max-age=3600' });
    } finally {
      res.off('close', onClose);
      const left = (open.get(client) ?? 1) - 1;
      if (left === 0) open.delete(client);
      else open.set(client, left);
    }
  };

  const handleProbe = async (res: ServerResponse, q: URLSearchParams): Promise<void> => {
    const point = pointParam(q.get('c'), 'c');
    const digits = q.get('digits') === null ? 20 : integerParam(q.get('digits'), 'digits', 1, 60);
    if (probing) {
      fail(res, 503, 'busy: one probe at a time', { 'retry-after': '1' });
      return;
    }
    probing = true;
    try {
      const report = await probePoint(parseDecimalPair(`${point.re},${point.im}`, 'c'), { digits, iterations: 100_000, maxPeriod: 1000 });
      sendJson(res, 200, report.json);
    } finally {
      probing = false;
    }
  };

  const handleJulia = async (res: ServerResponse, q: URLSearchParams): Promise<void> => {
    const c = pointParam(q.get('c'), 'c');
    const size = integerParam(q.get('size'), 'size', MIN_JULIA_SIZE, MAX_JULIA_SIZE);
    const gone = new AbortController();
    const onClose = (): void => {
      if (!res.writableEnded) gone.abort();
    };
    res.on('close', onClose);
    try {
      send(res, 200, 'image/png', await tiles.julia(c, size, gone.signal), { 'cache-control': 'private, max-age=3600' });
    } finally {
      res.off('close', onClose);
    }
  };

  const handleStrip = (res: ServerResponse, q: URLSearchParams): void => {
    const from = decimalParam(q.get('re0'), 're0', 4);
    const to = decimalParam(q.get('re1'), 're1', 4);
    const width = integerParam(q.get('w'), 'w', 2, MAX_STRIP_WIDTH);
    const height = integerParam(q.get('h'), 'h', 8, MAX_STRIP_HEIGHT);
    const a = Number(from);
    const b = Number(to);
    if (!(b - a > 1e-12 * Math.max(1, Math.abs(a)))) throw new UserError('re1', 'a right end above re0 by more than doubles resolve (1e-12 relative)', to);
    send(res, 200, 'image/png', encodePngTile(realStrip(a, b, width, height), width, height), { 'cache-control': 'private, max-age=3600' });
  };

  const handlePrint = async (req: IncomingMessage, res: ServerResponse): Promise<void> => {
    if (!sameToken(req.headers['x-survey-token'] as string | undefined, token)) {
      fail(res, 403, 'Expected the X-Survey-Token header of this run for print');
      return;
    }
    const origin = req.headers.origin;
    if (origin === undefined || !origins.has(origin.toLowerCase())) {
      fail(res, 403, `Expected the Origin of this server for print but received ${JSON.stringify(origin ?? null)}`);
      return;
    }
    if (!/^application\/json(;|$)/i.test(req.headers['content-type'] ?? '')) {
      fail(res, 415, 'Expected a JSON body (Content-Type: application/json) for print');
      return;
    }
    let body: unknown;
    const text = await readBody(req);
    try {
      body = JSON.parse(text);
    } catch {
      throw new UserError('body', 'a JSON object', `${text.slice(0, 40)}`);
    }
    if (typeof body !== 'object' || body === null || Array.isArray(body)) throw new UserError('body', 'a JSON object { re, im, span, width, height, samples }', body);
    const b = body as Record<string, unknown>;
    // No other field (a file name, say) is ever read; naming one is an error, so nobody believes it was honoured.
    for (const k of Object.keys(b))
      if (!['re', 'im', 'span', 'width', 'height', 'samples'].includes(k))
        throw new UserError(
          `body.${k.slice(0, 40)}`,
          'only the fields re, im, span, width, height, samples (the server names the file)',
          new Received(`a field "${k.slice(0, 40)}"`),
        );
    // Decimals as strings (a JSON number would already have lost digits), sizes as numbers.
    const str = (k: string): string | null => (typeof b[k] === 'string' ? (b[k] as string) : null);
    const num = (k: string): string | null => (typeof b[k] === 'number' ? String(b[k]) : null);
    const re = decimalParam(str('re'), 're', 4);
    const im = decimalParam(str('im'), 'im', 4);
    const span = spanParam(str('span'), 'span');
    const width = evenSideParam(num('width'), 'width');
    const height = evenSideParam(num('height'), 'height');
    if (width > MAX_PRINT_SIDE || height > MAX_PRINT_SIDE) throw new UserError('width', `sides of at most ${MAX_PRINT_SIDE} pixels`, `${width}x${height}`);
    const samples = b['samples'] === undefined ? o.base.samples : integerParam(num('samples'), 'samples', 1, 64);
    if (!Number.isInteger(Math.sqrt(samples))) throw new UserError('samples', 'a square number of samples (1, 4, 9, 16, 25, 36, 49, 64)', samples);
    if (printing) {
      fail(res, 503, 'busy: one print at a time', { 'retry-after': '5' });
      return;
    }
    printing = true;
    try {
      // A name no earlier print (of this run or another) holds.
      let name = '';
      let file = '';
      do {
        name = `survey-${stamp(new Date())}-${++prints}.png`;
        file = path.join(o.outDir, name);
      } while (existsSync(file));
      const sheet: Sheet = {
        ...o.base,
        title: o.base.title === '' ? 'survey print' : o.base.title,
        view: { re, im, span, rotation: 0 },
        width,
        height,
        samples,
        output: { file, data: null, sidecar: true },
      };
      const summary = await renderSheet(sheet, { workers: o.workers, label: name });
      log(`quadatlas survey: printed ${summary.file} in ${summary.seconds} s`);
      sendJson(res, 200, { file: summary.file, files: summary.files, seconds: summary.seconds, arithmetic: summary.arithmetic, iterations: summary.iterations });
    } finally {
      printing = false;
    }
  };

  const handle = async (req: IncomingMessage, res: ServerResponse): Promise<void> => {
    const host = (req.headers.host ?? '').toLowerCase();
    if (!hosts.has(host)) {
      fail(res, 403, `Expected the Host ${[...hosts][0]} but received ${JSON.stringify(req.headers.host ?? null)}`);
      return;
    }
    const raw = req.url ?? '/';
    if (raw.length > MAX_URL) {
      fail(res, 414, `Expected a request line of at most ${MAX_URL} characters but received ${raw.length}`);
      return;
    }
    const mark = raw.indexOf('?');
    // The path is compared as sent, never decoded or resolved: only the exact names below exist.
    const route = mark < 0 ? raw : raw.slice(0, mark);
    const q = new URLSearchParams(mark < 0 ? '' : raw.slice(mark + 1));
    const method = req.method ?? 'GET';
    if (route === '/print') {
      if (method !== 'POST') {
        fail(res, 405, `Expected POST for /print but received ${method}`, { allow: 'POST' });
        return;
      }
      await handlePrint(req, res);
      return;
    }
    if (method !== 'GET' && method !== 'HEAD') {
      fail(res, 405, `Expected GET for ${route.slice(0, 60)} but received ${method}`, { allow: 'GET, HEAD' });
      return;
    }
    const file = page.get(route);
    if (file !== undefined) {
      send(res, 200, file.type, file.body);
      return;
    }
    if (route !== '/tile' && route !== '/probe' && route !== '/julia' && route !== '/strip' && route !== '/base') {
      fail(res, 404, `Expected one of the page's own paths but received ${JSON.stringify(route.slice(0, 80))}`);
      return;
    }
    if (!sameToken(q.get('t'), token)) {
      fail(res, 403, `Expected the token of this run (t) for ${route}`);
      return;
    }
    if (route === '/tile') await handleTile(req, res, q);
    else if (route === '/probe') await handleProbe(res, q);
    else if (route === '/julia') await handleJulia(res, q);
    else if (route === '/strip') handleStrip(res, q);
    else sendJson(res, 200, { sheet: renderRecord(o.base, toolVersion()), version: toolVersion() });
  };

  const server: Server = createServer({ maxHeaderSize: 8192, requestTimeout: 120_000 }, (req, res) => {
    handle(req, res).catch((err: unknown) => {
      if (err instanceof UserError) fail(res, 400, err.message);
      else if (err instanceof QueueFull) fail(res, 503, `busy: ${err.message}`, { 'retry-after': '1' });
      else if (err instanceof Withdrawn) res.destroy();
      else if (err instanceof ConvergenceError) fail(res, 422, `did not converge: ${err.message}`);
      else {
        const text = err instanceof Error ? err.message : String(err);
        log(`quadatlas survey: internal error: ${text.split('\n')[0]}`);
        fail(res, 500, `internal error: ${text.split('\n')[0]}`);
      }
    });
  });
  server.headersTimeout = 20_000;
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(o.port, o.host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  hosts = allowedHosts(o.host, port);
  origins = new Set([...hosts].map((h) => `http://${h}`));
  const shown = o.host.includes(':') ? `[${o.host}]` : o.host;
  const originText = `http://${shown}:${port}`;
  return {
    url: `${originText}/?t=${token}`,
    origin: originText,
    token,
    port,
    tiles,
    async close(): Promise<void> {
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await closed;
      await tiles.close();
    },
  };
}
