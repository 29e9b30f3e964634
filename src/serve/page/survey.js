// The survey page: the c-plane drawn from tiles the server renders on
// demand. The view is an exact decimal centre and pixel spacing (decimal.js
// here); tiles belong to a frame (a plate: centre, span, width x height) at a
// zoom level (spacing x 2^-level), numbered from the frame's centre. Moving
// about shifts the view within the frame by whole pixels; when the view
// leaves the frame or has zoomed far from it, a new frame is taken at the
// current view (the old tiles stay underneath until the new ones arrive).
import * as D from './decimal.js';

const TILE = 256;
const MARGIN = 256;
const MAX_FETCHES = 6;
const MAX_TILES = 500;
const MAX_LEVEL_DRIFT = 6;
const DEEPEST = -380;
const WIDEST = D.parse('16');

const token = new URLSearchParams(location.search).get('t') ?? '';
const $ = (id) => document.getElementById(id);
const plane = $('plane');
const canvas = $('canvas');
const ctx = canvas.getContext('2d', { alpha: false });

let base = null;
let vw = 2;
let vh = 2;
let anchor = null;
let anchors = 0;
let level = 0;
let ox = 0;
let oy = 0;
/** key -> { anchor, level, tx, ty, bitmap, rect, ctrl, state: 'wait'|'fetch'|'done'|'fail', retryAt } */
const tiles = new Map();
/** Tiles of earlier frames drawn underneath until the new frame's tiles cover them. */
let backdrop = [];
let fetching = 0;
let settleTimer = 0;
let lastProbe = null;

function spacingAt(a, l) {
  return D.mulPow2(a.spacing, l);
}
function viewSpacing() {
  return spacingAt(anchor, level);
}
function centre() {
  const s = viewSpacing();
  return { re: D.add(anchor.re, D.mulInt(s, ox)), im: D.sub(anchor.im, D.mulInt(s, oy)) };
}
/** Digits after the point that tell neighbouring pixels apart, and one more. */
function places(s) {
  return Math.max(2, -D.magnitude(s) + 1);
}

function message(text) {
  $('message').textContent = text;
}

function newAnchor(re, im, spacing, margin) {
  anchors += 1;
  return { id: anchors, re, im, spacing, w: vw + 2 * margin, h: vh + 2 * margin };
}

/** Takes a new frame at (re, im, spacing); the old frame's visible tiles become the backdrop. */
function setAnchor(next) {
  const keep = [];
  for (const t of tiles.values()) {
    if (t.ctrl) t.ctrl.abort();
    if (t.bitmap && onScreen(t)) keep.push(t);
  }
  backdrop = [...backdrop.filter(onScreen), ...keep].slice(-200);
  tiles.clear();
  anchor = next;
  level = 0;
  ox = 0;
  oy = 0;
}

function frameSpan(a) {
  return D.toText(D.mulInt(a.spacing, a.w));
}

// ---- geometry of a tile on screen -------------------------------------------------

/** Screen rectangle of a tile (any frame, any level). */
function screenRect(t) {
  const c = centre();
  const s = viewSpacing();
  const a = t.anchor;
  const k = D.ratio(spacingAt(a, t.level), s);
  if (a === anchor) {
    const f = 2 ** (level - t.level);
    return { x: vw / 2 - ox + (t.rect.x0 - a.w / 2) * f, y: vh / 2 - oy + (t.rect.y0 - a.h / 2) * f, w: t.rect.w * f, h: t.rect.h * f };
  }
  const dx = D.ratio(D.sub(a.re, c.re), s);
  const dy = -D.ratio(D.sub(a.im, c.im), s);
  return { x: vw / 2 + dx + (t.rect.x0 - a.w / 2) * k, y: vh / 2 + dy + (t.rect.y0 - a.h / 2) * k, w: t.rect.w * k, h: t.rect.h * k };
}

function onScreen(t) {
  if (!t.rect) return false;
  const r = screenRect(t);
  return r.x < vw && r.y < vh && r.x + r.w > 0 && r.y + r.h > 0 && r.w > 0.5;
}

/** The tiles of the current frame at level l that meet the screen. */
function wantedAt(l) {
  const f = 2 ** (l - level);
  const cx = ox * f;
  const cy = oy * f;
  const hw = (vw / 2) * f;
  const hh = (vh / 2) * f;
  const rx = Math.ceil(anchor.w / 2 / TILE);
  const ry = Math.ceil(anchor.h / 2 / TILE);
  const out = [];
  const x0 = Math.max(-rx, Math.floor((cx - hw) / TILE));
  const x1 = Math.min(rx - 1, Math.floor((cx + hw - 1e-9) / TILE));
  const y0 = Math.max(-ry, Math.floor((cy - hh) / TILE));
  const y1 = Math.min(ry - 1, Math.floor((cy + hh - 1e-9) / TILE));
  for (let ty = y0; ty <= y1; ty++) for (let tx = x0; tx <= x1; tx++) out.push({ l, tx, ty, d: Math.hypot((tx + 0.5) * TILE - cx, (ty + 0.5) * TILE - cy) });
  out.sort((a, b) => a.d - b.d);
  return out;
}

function tileKey(a, l, tx, ty) {
  return `${a.id}|${l}|${tx}|${ty}`;
}

function rectOf(a, tx, ty) {
  const x0 = a.w / 2 + tx * TILE;
  const y0 = a.h / 2 + ty * TILE;
  const cx0 = Math.max(0, x0);
  const cy0 = Math.max(0, y0);
  return { x0: cx0, y0: cy0, w: Math.min(a.w, x0 + TILE) - cx0, h: Math.min(a.h, y0 + TILE) - cy0 };
}

// ---- fetching ----------------------------------------------------------------------

function tileUrl(a, l, tx, ty) {
  const q = new URLSearchParams({ re: D.toText(a.re), im: D.toText(a.im), span: frameSpan(a), w: String(a.w), h: String(a.h), level: String(l), size: String(TILE), tx: String(tx), ty: String(ty), t: token });
  return `/tile?${q}`;
}

/** Asks for what the screen needs, coarse level first; drops what it no longer needs. */
function schedule() {
  const want = [...(level - 2 >= -30 ? wantedAt(level - 2) : []), ...wantedAt(level)];
  const keys = new Set();
  for (const w of want) {
    const key = tileKey(anchor, w.l, w.tx, w.ty);
    keys.add(key);
    if (!tiles.has(key)) tiles.set(key, { anchor, level: w.l, tx: w.tx, ty: w.ty, rect: rectOf(anchor, w.tx, w.ty), bitmap: null, ctrl: null, state: 'wait', retryAt: 0 });
  }
  for (const [key, t] of tiles) {
    if (keys.has(key)) continue;
    if (t.state === 'fetch') {
      t.ctrl.abort();
      tiles.delete(key);
    } else if (t.state !== 'done') tiles.delete(key);
  }
  if (tiles.size > MAX_TILES) {
    for (const [key, t] of tiles) {
      if (tiles.size <= MAX_TILES) break;
      if (!keys.has(key)) tiles.delete(key);
    }
  }
  const now = performance.now();
  for (const w of want) {
    if (fetching >= MAX_FETCHES) break;
    const t = tiles.get(tileKey(anchor, w.l, w.tx, w.ty));
    if (t.state === 'wait' && t.retryAt <= now) fetchTile(t);
  }
  $('busy').hidden = !busy();
}

function busy() {
  for (const t of tiles.values()) if (t.anchor === anchor && t.level === level && t.state !== 'done' && t.state !== 'fail' && onScreen(t)) return true;
  return false;
}

async function fetchTile(t) {
  t.state = 'fetch';
  t.ctrl = new AbortController();
  fetching += 1;
  try {
    const r = await fetch(tileUrl(t.anchor, t.level, t.tx, t.ty), { signal: t.ctrl.signal });
    if (r.status === 503) {
      t.state = 'wait';
      t.retryAt = performance.now() + 400;
      setTimeout(schedule, 450);
      return;
    }
    if (!r.ok) {
      t.state = 'fail';
      const body = await r.json().catch(() => ({ error: r.statusText }));
      message(`tile refused: ${body.error}`);
      return;
    }
    t.bitmap = await createImageBitmap(await r.blob());
    t.state = 'done';
    draw();
  } catch (err) {
    if (t.state === 'fetch') {
      t.state = 'wait';
      t.retryAt = performance.now() + 1000;
    }
  } finally {
    t.ctrl = null;
    fetching -= 1;
    if (anchor) schedule();
  }
}

// ---- drawing -----------------------------------------------------------------------

function drawTile(t) {
  const r = screenRect(t);
  const exact = Math.abs(r.w - t.rect.w) < 1e-6;
  ctx.imageSmoothingEnabled = !exact;
  if (exact) ctx.drawImage(t.bitmap, Math.round(r.x), Math.round(r.y));
  else ctx.drawImage(t.bitmap, r.x, r.y, r.w, r.h);
}

function draw() {
  ctx.fillStyle = '#0d1417';
  ctx.fillRect(0, 0, vw, vh);
  for (const t of backdrop) if (t.bitmap && onScreen(t)) drawTile(t);
  const mine = [...tiles.values()].filter((t) => t.bitmap && t.anchor === anchor);
  mine.sort((a, b) => a.level - b.level);
  for (const t of mine) if (onScreen(t)) drawTile(t);
  showWhere();
}

function showWhere() {
  const c = centre();
  const s = viewSpacing();
  const p = places(s);
  $('centre-re').textContent = D.toFixed(c.re, p);
  $('centre-im').textContent = D.toFixed(c.im, p);
  $('span').textContent = D.toText(D.roundSignificant(D.mulInt(s, vw), 6));
  const zoom = D.ratio(D.parse('3'), D.mulInt(s, vw));
  $('zoom').textContent = zoom >= 1e5 ? `${zoom.toExponential(2)} x` : `${zoom.toPrecision(3)} x`;
  const bar = 100;
  $('scale-bar').style.width = `${bar}px`;
  $('scale-text').textContent = D.toText(D.roundSignificant(D.mulInt(s, bar), 3));
}

// ---- the real slice ----------------------------------------------------------------

const STRIP_HEIGHT = 110;
let stripAt = null;

/** The bifurcation diagram under the plane while the view meets the real axis and doubles resolve it. */
function updateStrip() {
  const c = centre();
  const s = viewSpacing();
  const halfH = D.mulInt(s, vh / 2);
  const meets = D.compare(D.sub(c.im, halfH), D.dec(0)) <= 0 && D.compare(D.add(c.im, halfH), D.dec(0)) >= 0;
  const wide = D.magnitude(s) + Math.log10(vw) > -11;
  const slice = $('slice');
  if (!meets || !wide) {
    slice.hidden = true;
    stripAt = null;
    return;
  }
  const halfW = D.mulInt(s, vw / 2);
  const re0 = D.toText(D.roundSignificant(D.sub(c.re, halfW), 17));
  const re1 = D.toText(D.roundSignificant(D.add(c.re, halfW), 17));
  // Keep the strip away from the axis: at the top when the axis is in the lower half of the screen.
  const axisLow = D.compare(c.im, D.dec(0)) > 0;
  slice.className = axisLow ? 'top' : 'bottom';
  const strip = $('strip');
  strip.width = vw;
  strip.height = STRIP_HEIGHT;
  strip.style.transform = '';
  strip.src = `/strip?${new URLSearchParams({ re0, re1, w: String(vw), h: String(STRIP_HEIGHT), t: token })}`;
  slice.hidden = false;
  stripAt = { anchor, level, ox };
}

/** While dragging, the strip moves with the plane; after a zoom it waits for the next settle. */
function followStrip() {
  if (stripAt === null) return;
  if (stripAt.anchor !== anchor || stripAt.level !== level) {
    $('slice').hidden = true;
    return;
  }
  $('strip').style.transform = `translateX(${stripAt.ox - ox}px)`;
}

// ---- the view in the address --------------------------------------------------------

function writeFragment() {
  const c = centre();
  const q = new URLSearchParams({ re: D.toText(c.re), im: D.toText(c.im), span: D.toText(D.mulInt(viewSpacing(), vw)) });
  history.replaceState(null, '', `${location.pathname}${location.search}#${q}`);
}

function readFragment() {
  const q = new URLSearchParams(location.hash.slice(1));
  const re = D.parse(q.get('re') ?? '');
  const im = D.parse(q.get('im') ?? '');
  const span = D.parse(q.get('span') ?? '');
  if (re === null || im === null || span === null || span.m <= 0n) return null;
  return { re, im, spacing: D.divide(span, D.dec(vw), 14) };
}

function homeView() {
  const v = base.sheet.view;
  return { re: D.parse(v.re), im: D.parse(v.im), spacing: D.divide(D.parse(v.span), D.dec(vw), 4) };
}

function goTo(v) {
  setAnchor(newAnchor(v.re, v.im, v.spacing, MARGIN));
  draw();
  schedule();
  writeFragment();
  updateStrip();
}

// ---- moving about -------------------------------------------------------------------

/** After a pause in moving: a new frame when the view has left this one, the address updated. */
function settle() {
  clearTimeout(settleTimer);
  settleTimer = setTimeout(() => {
    const inside = Math.abs(ox) + vw / 2 <= anchor.w / 2 && Math.abs(oy) + vh / 2 <= anchor.h / 2;
    if (!inside || Math.abs(level) > MAX_LEVEL_DRIFT) {
      const c = centre();
      let s = viewSpacing();
      if (s.m.toString().length > 12) s = D.roundSignificant(s, 10);
      const cut = D.magnitude(s) - 4;
      setAnchor(newAnchor(D.roundTo(c.re, cut), D.roundTo(c.im, cut), s, MARGIN));
      draw();
    }
    schedule();
    writeFragment();
    updateStrip();
  }, 220);
}

function zoomAt(px, py, dir) {
  const dx = Math.round(px - vw / 2);
  const dy = Math.round(py - vh / 2);
  const s = viewSpacing();
  if (dir > 0 && D.magnitude(s) <= DEEPEST) {
    message('deeper than the survey goes; save the sheet and render it with plate');
    return;
  }
  if (dir < 0 && D.compare(D.mulInt(s, 2 * vw), WIDEST) > 0) return;
  if (dir > 0) {
    level += 1;
    ox = 2 * ox + dx;
    oy = 2 * oy + dy;
  } else {
    level -= 1;
    ox = Math.round((ox - dx) / 2);
    oy = Math.round((oy - dy) / 2);
  }
  followStrip();
  draw();
  schedule();
  settle();
}

function panBy(dx, dy) {
  ox -= Math.round(dx);
  oy -= Math.round(dy);
  followStrip();
  draw();
  schedule();
}

/** c at the centre of pixel (i, j) of the screen, exact. */
function pixelC(i, j) {
  const c = centre();
  const half = D.mulPow2(viewSpacing(), 1);
  return { re: D.add(c.re, D.mulInt(half, 2 * i + 1 - vw)), im: D.add(c.im, D.mulInt(half, vh - 2 * j - 1)) };
}

function readout(i, j) {
  const z = pixelC(i, j);
  const p = places(viewSpacing());
  $('pointer-re').textContent = D.toFixed(z.re, p);
  $('pointer-im').textContent = D.toFixed(z.im, p);
}

let drag = null;
plane.addEventListener('pointerdown', (ev) => {
  if (ev.button !== 0) return;
  plane.setPointerCapture(ev.pointerId);
  drag = { x: ev.offsetX, y: ev.offsetY, sx: ev.offsetX, sy: ev.offsetY, moved: false };
  plane.focus();
});
plane.addEventListener('pointermove', (ev) => {
  readout(Math.floor(ev.offsetX), Math.floor(ev.offsetY));
  if (drag === null) return;
  const dx = Math.round(ev.offsetX - drag.x);
  const dy = Math.round(ev.offsetY - drag.y);
  if (Math.abs(ev.offsetX - drag.sx) + Math.abs(ev.offsetY - drag.sy) > 4) {
    drag.moved = true;
    plane.classList.add('dragging');
  }
  if (drag.moved && (dx !== 0 || dy !== 0)) {
    drag.x += dx;
    drag.y += dy;
    panBy(dx, dy);
  }
});
plane.addEventListener('pointerup', (ev) => {
  if (drag === null) return;
  const moved = drag.moved;
  drag = null;
  plane.classList.remove('dragging');
  if (moved) settle();
  else probe(Math.floor(ev.offsetX), Math.floor(ev.offsetY));
});
plane.addEventListener('pointerleave', () => {
  $('pointer-re').textContent = '-';
  $('pointer-im').textContent = '-';
});

let wheelAt = 0;
let wheelSum = 0;
plane.addEventListener('wheel', (ev) => {
  ev.preventDefault();
  wheelSum += ev.deltaMode === 0 ? ev.deltaY : ev.deltaY * 40;
  const now = performance.now();
  if (Math.abs(wheelSum) < 40 || now - wheelAt < 140) return;
  wheelAt = now;
  const dir = wheelSum < 0 ? 1 : -1;
  wheelSum = 0;
  zoomAt(ev.offsetX, ev.offsetY, dir);
}, { passive: false });

plane.addEventListener('keydown', (ev) => {
  const step = 64;
  const keys = {
    '+': () => zoomAt(vw / 2, vh / 2, 1),
    '=': () => zoomAt(vw / 2, vh / 2, 1),
    '-': () => zoomAt(vw / 2, vh / 2, -1),
    '_': () => zoomAt(vw / 2, vh / 2, -1),
    ArrowLeft: () => (panBy(step, 0), settle()),
    ArrowRight: () => (panBy(-step, 0), settle()),
    ArrowUp: () => (panBy(0, step), settle()),
    ArrowDown: () => (panBy(0, -step), settle()),
    '0': () => goTo(homeView()),
    Home: () => goTo(homeView()),
  };
  const f = keys[ev.key];
  if (f) {
    ev.preventDefault();
    f();
  }
});

// ---- the probe ----------------------------------------------------------------------

function fact(dl, name, value) {
  const dt = document.createElement('dt');
  dt.textContent = name;
  const dd = document.createElement('dd');
  dd.textContent = value;
  dd.className = 'num';
  dl.append(dt, dd);
}

function short(x, n = 6) {
  return typeof x === 'number' ? Number(x.toPrecision(n)).toString() : String(x);
}

async function probe(i, j) {
  const z = pixelC(i, j);
  const p = places(viewSpacing()) + 2;
  const c = `${D.toFixed(z.re, p)},${D.toFixed(z.im, p)}`;
  const dl = $('point-facts');
  $('point-hint').textContent = 'asking...';
  $('to-nucleus').hidden = true;
  $('julia-box').hidden = true;
  dl.replaceChildren();
  const r = await fetch(`/probe?${new URLSearchParams({ c, t: token })}`);
  const j2 = await r.json().catch(() => ({ error: r.statusText }));
  if (!r.ok) {
    $('point-hint').textContent = `no answer: ${j2.error}`;
    return;
  }
  lastProbe = j2;
  $('point-hint').textContent = '';
  fact(dl, 'c', `${j2.c.re}, ${j2.c.im}`);
  if (j2.escapes) {
    fact(dl, 'escapes', `after ${j2.iterations} iterations`);
    fact(dl, 'smooth count', short(j2.smoothCount, 8));
    fact(dl, 'distance', `about ${short(j2.exteriorDistance, 3)} (between a quarter of this and this)`);
  } else if (j2.period === null) {
    fact(dl, 'inside', 'no attracting cycle found up to period 1000');
  } else {
    const k = j2.component;
    fact(dl, 'period', String(j2.period));
    fact(dl, '|multiplier|', short(j2.multiplierModulus, 6));
    fact(dl, 'internal angle', `${short(j2.internalAngle, 6)} turn`);
    fact(dl, 'nucleus', `${k.nucleus.re}, ${k.nucleus.im}`);
    fact(dl, 'root', `${k.root.re}, ${k.root.im}`);
    fact(dl, 'size', short(k.size, 4));
    fact(dl, 'shape', k.shape);
    if (k.externalAngles) fact(dl, 'angles', k.externalAngles.join(', '));
    if (k.internalAddress) fact(dl, 'address', k.internalAddress);
    if (k.parent) fact(dl, 'bud of', `period ${k.parent.period} at ${k.parent.internalAngle}`);
    $('to-nucleus').hidden = false;
  }
  if (j2.logistic) fact(dl, 'logistic r', j2.logistic.r);
  // The dynamical plane of the same c, rendered like `quadatlas julia` (serve/tile-service.ts, juliaInsetSheet).
  $('julia').src = `/julia?${new URLSearchParams({ c, size: '240', t: token })}`;
  $('julia-cmd').textContent = `quadatlas julia --c ${c}`;
  $('julia-box').hidden = false;
  if (j2.window) fact(dl, 'window', `period ${j2.window.period} (${j2.window.word}), r ${j2.window.onsetR} to ${j2.window.endR}`);
}

$('to-nucleus').addEventListener('click', () => {
  const k = lastProbe?.component;
  if (!k) return;
  const size = D.parse(typeof k.size === 'number' ? k.size.toExponential(6) : String(k.size));
  const re = D.parse(k.nucleus.re);
  const im = D.parse(k.nucleus.im);
  if (size === null || re === null || im === null) return;
  // The size estimate is about the component's diameter (period 1: 1): a view 3 sizes wide frames it.
  goTo({ re, im, spacing: D.divide(D.mulInt(size, 3), D.dec(vw), 3) });
});

// ---- taking the view home -------------------------------------------------------------

function stampNow() {
  const d = new Date();
  const p = (n) => String(n).padStart(2, '0');
  return `${d.getUTCFullYear()}${p(d.getUTCMonth() + 1)}${p(d.getUTCDate())}-${p(d.getUTCHours())}${p(d.getUTCMinutes())}${p(d.getUTCSeconds())}`;
}

/** The view exactly as shown: the frame becomes the screen itself, so the plate of the sheet is what is drawn. */
function exactView() {
  const c = centre();
  const s = viewSpacing();
  if (anchor.w !== vw || anchor.h !== vh || ox !== 0 || oy !== 0 || level !== 0) {
    setAnchor(newAnchor(c.re, c.im, s, 0));
    draw();
    schedule();
  }
  return { re: D.toText(c.re), im: D.toText(c.im), span: D.toText(D.mulInt(s, vw)), width: vw, height: vh };
}

$('save').addEventListener('click', () => {
  const v = exactView();
  const name = `survey-${stampNow()}`;
  const sheet = { ...base.sheet, title: base.sheet.title || 'from the survey page', view: { re: v.re, im: v.im, span: v.span, rotation: 0 }, pixels: { width: v.width, height: v.height }, output: { file: `out/${name}.png`, sidecar: true } };
  const blob = new Blob([`${JSON.stringify(sheet, null, 2)}\n`], { type: 'application/json' });
  const a = document.createElement('a');
  a.href = URL.createObjectURL(blob);
  a.download = `${name}.json`;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
  const cmd = $('command');
  cmd.hidden = false;
  cmd.textContent = `quadatlas plate ${name}.json`;
  message(`saved ${name}.json: that command renders it to out/${name}.png`);
});

$('print').addEventListener('click', async () => {
  const v = exactView();
  const k = Number($('print-scale').value);
  const body = { re: v.re, im: v.im, span: v.span, width: v.width * k, height: v.height * k, samples: Number($('print-samples').value) };
  $('print').disabled = true;
  message(`printing ${body.width} x ${body.height} ...`);
  try {
    const r = await fetch('/print', { method: 'POST', headers: { 'content-type': 'application/json', 'x-survey-token': token }, body: JSON.stringify(body) });
    const j = await r.json().catch(() => ({ error: r.statusText }));
    message(r.ok ? `printed ${j.file} in ${j.seconds} s` : `print refused: ${j.error}`);
  } finally {
    $('print').disabled = false;
  }
});

$('home').addEventListener('click', () => goTo(homeView()));

// ---- start ---------------------------------------------------------------------------

function measure() {
  vw = Math.max(2, Math.floor(plane.clientWidth / 2) * 2);
  vh = Math.max(2, Math.floor(plane.clientHeight / 2) * 2);
  canvas.width = vw;
  canvas.height = vh;
}

window.addEventListener('resize', () => {
  const before = [vw, vh];
  measure();
  if (anchor && (before[0] !== vw || before[1] !== vh)) {
    draw();
    settle();
  }
});
window.addEventListener('hashchange', () => {
  const v = readFragment();
  if (v) goTo(v);
});

async function start() {
  measure();
  const r = await fetch(`/base?${new URLSearchParams({ t: token })}`);
  if (!r.ok) {
    message('This page needs the address quadatlas survey printed (with its token).');
    return;
  }
  base = await r.json();
  goTo(readFragment() ?? homeView());
  plane.focus();
}

// For tests and the curious: the exact view, whether the screen is complete, c at a pixel.
window.survey = {
  view: () => ({ ...Object.fromEntries(Object.entries(centre()).map(([k, v]) => [k, D.toText(v)])), spacing: D.toText(viewSpacing()), width: vw, height: vh, level, frame: { w: anchor.w, h: anchor.h } }),
  idle: () => anchor !== null && !busy() && fetching === 0,
  pixelC: (i, j) => Object.fromEntries(Object.entries(pixelC(i, j)).map(([k, v]) => [k, D.toText(v)])),
  places: () => places(viewSpacing()),
};

start();
