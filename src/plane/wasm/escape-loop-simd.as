// AssemblyScript source of the WebAssembly SIMD escape loop (compiled by
// scripts/build-wasm.mjs; the extension is .as so that tsc leaves it alone).
//
// The loop is the one of src/plane/escape-loop.ts, run on 8 samples at a time
// as 4 vectors of f64x2 kept in flight together, so that the 12-cycle chain
// mul -> sub -> add of one vector overlaps with the other three.
// The lanes of a group advance in lock-step: the iteration counter n, and
// with it Brent's save schedule (saved, next), is shared by all 8 lanes.
// A lane that stops is marked in its vector's `done` mask and settled
// (its results written) at once; it keeps computing, but nothing reads it.
// Tried and dropped (slower under V8 on x86-64): 2, 3, 5 and 6 vectors;
// reloading c from memory each step; zeroing finished lanes so that the test
// needs no mask; a pmax tree of |z|^2 with one comparison. The all-lanes
// test uses i64x2.bitmask (one movmskpd) rather than i64x2.all_true.
// Lane arithmetic is the scalar loop's, operation for operation (no fused
// multiply-add exists in WebAssembly SIMD), so results are bit-identical.
//
// Brent, "An improved Monte Carlo factorization algorithm", BIT 20 (1980)
// 176-184: cycle detection by comparing with a point saved at powers of two.

const CAPACITY: i32 = 4096;

const CR: usize = memory.data(CAPACITY * 8, 16);
const CI: usize = memory.data(CAPACITY * 8, 16);
const ITERATIONS: usize = memory.data(CAPACITY * 4, 16);
const ZRE: usize = memory.data(CAPACITY * 8, 16);
const ZIM: usize = memory.data(CAPACITY * 8, 16);
const CYCLE: usize = memory.data(CAPACITY * 4, 16);
const STATUS: usize = memory.data(CAPACITY, 16);
// The 4 `done` masks of the group in flight. Kept in memory rather than in
// locals: the loop reads them as memory operands, and the 16 xmm registers
// V8 allocates go to x, y, x2, y2 and c (measured: +5% over locals).
const DONE: usize = memory.data(64, 16);
// The group's state (x, y, x^2, y^2 of 4 vectors) saved before a block of
// BLOCK unchecked steps, restored when the block turns out to cross an escape.
const SAVE: usize = memory.data(256, 16);
const BLOCK: i32 = 4;

const MAXED: u8 = 0;
const ESCAPED: u8 = 1;
const CYCLED: u8 = 2;

export function capacity(): i32 { return CAPACITY; }
export function crPointer(): usize { return CR; }
export function ciPointer(): usize { return CI; }
export function iterationsPointer(): usize { return ITERATIONS; }
export function zRePointer(): usize { return ZRE; }
export function zImPointer(): usize { return ZIM; }
export function cyclePointer(): usize { return CYCLE; }
export function statusPointer(): usize { return STATUS; }

/** Writes the results of one sample; the status rule is the scalar loop's. */
function settle(slot: i32, n: i32, x: f64, y: f64, x2: f64, y2: f64, r2: f64, tripped: bool, cycle: i32): void {
  const s = <usize>slot;
  store<i32>(ITERATIONS + (s << 2), n);
  store<f64>(ZRE + (s << 3), x);
  store<f64>(ZIM + (s << 3), y);
  store<i32>(CYCLE + (s << 2), cycle);
  store<u8>(STATUS + s, x2 + y2 > r2 ? ESCAPED : tripped ? CYCLED : MAXED);
}

/** Settles the lanes of one vector that are set in `stop`. */
function settleVector(slot: i32, stop: v128, n: i32, x: v128, y: v128, x2: v128, y2: v128, r2: f64, tripped: bool, cycle: i32): void {
  if (i64x2.extract_lane(stop, 0) != 0) {
    settle(slot, n, f64x2.extract_lane(x, 0), f64x2.extract_lane(y, 0), f64x2.extract_lane(x2, 0), f64x2.extract_lane(y2, 0), r2, tripped, cycle);
  }
  if (i64x2.extract_lane(stop, 1) != 0) {
    settle(slot + 1, n, f64x2.extract_lane(x, 1), f64x2.extract_lane(y, 1), f64x2.extract_lane(x2, 1), f64x2.extract_lane(y2, 1), r2, tripped, cycle);
  }
}

/** The largest |c|^2 over the 8 lanes (padding lanes may hold stale values: they can only turn blocks off). */
function maxC2(cr0: v128, ci0: v128, cr1: v128, ci1: v128, cr2: v128, ci2: v128, cr3: v128, ci3: v128): f64 {
  const a = f64x2.max(f64x2.add(f64x2.mul(cr0, cr0), f64x2.mul(ci0, ci0)), f64x2.add(f64x2.mul(cr1, cr1), f64x2.mul(ci1, ci1)));
  const b = f64x2.max(f64x2.add(f64x2.mul(cr2, cr2), f64x2.mul(ci2, ci2)), f64x2.add(f64x2.mul(cr3, cr3), f64x2.mul(ci3, ci3)));
  const m = f64x2.max(a, b);
  return max<f64>(f64x2.extract_lane(m, 0), f64x2.extract_lane(m, 1));
}

/** Whether every lane of the group in flight is done. */
function allDone(): bool {
  const a = v128.and(v128.load(DONE), v128.load(DONE, 16));
  const b = v128.and(v128.load(DONE, 32), v128.load(DONE, 48));
  return i64x2.bitmask(v128.and(a, b)) == 3;
}

/** The mask of lanes beyond `count` (they start, and stay, done). */
@inline
function padding(slot: i32, count: i32): v128 {
  return i64x2(slot >= count ? -1 : 0, slot + 1 >= count ? -1 : 0);
}

/**
 * Runs the escape loop on slots [0, count) of the input buffers, writing the
 * output buffers. tolerance2 > 0 turns on the cycle test.
 *
 * Every orbit starts at iteration `start` from z = (ZRE, ZIM) of its slot
 * (0 for a fresh orbit): `start` must be 0 or a power of two, a point of
 * Brent's save schedule, where the saved point is the current z and the next
 * save comes at 2 start. An orbit stopped at such a point (status MAXED with
 * the limit a power of two) and run on from it therefore takes exactly the
 * steps of one uninterrupted run; the caller uses this to regroup the orbits
 * still running between rounds, so lanes of a group finish close together.
 */
export function run(count: i32, start: i32, maxIterations: i32, escapeRadius2: f64, tolerance2: f64): void {
  for (let base = 0; base < count; base += 8) {
    if (tolerance2 > 0) group8Cycle(base, count, start, maxIterations, escapeRadius2, tolerance2);
    else group8(base, count, start, maxIterations, escapeRadius2);
  }
}

function group8(base: i32, count: i32, start: i32, maxIterations: i32, r2: f64): void {
  const p = CR + (<usize>base << 3), q = CI + (<usize>base << 3);
  const cr0 = v128.load(p), cr1 = v128.load(p, 16), cr2 = v128.load(p, 32), cr3 = v128.load(p, 48);
  const ci0 = v128.load(q), ci1 = v128.load(q, 16), ci2 = v128.load(q, 32), ci3 = v128.load(q, 48);
  const r = f64x2.splat(r2);
  v128.store(DONE, padding(base, count));
  v128.store(DONE, padding(base + 2, count), 16);
  v128.store(DONE, padding(base + 4, count), 32);
  v128.store(DONE, padding(base + 6, count), 48);
  const zr = ZRE + (<usize>base << 3), zi = ZIM + (<usize>base << 3);
  let x0 = v128.load(zr), y0 = v128.load(zi), xx0 = f64x2.mul(x0, x0), yy0 = f64x2.mul(y0, y0);
  let x1 = v128.load(zr, 16), y1 = v128.load(zi, 16), xx1 = f64x2.mul(x1, x1), yy1 = f64x2.mul(y1, y1);
  let x2 = v128.load(zr, 32), y2 = v128.load(zi, 32), xx2 = f64x2.mul(x2, x2), yy2 = f64x2.mul(y2, y2);
  let x3 = v128.load(zr, 48), y3 = v128.load(zi, 48), xx3 = f64x2.mul(x3, x3), yy3 = f64x2.mul(y3, y3);
  let n = start;
  // Blocks are safe when R >= 2 and every lane's |c| <= R (see below); else every step is tested.
  const fast = r2 >= 4 && maxC2(cr0, ci0, cr1, ci1, cr2, ci2, cr3, ci3) <= r2;
  let slow = 0;
  while (n < maxIterations) {
    const go0 = v128.or(f64x2.le(f64x2.add(xx0, yy0), r), v128.load(DONE));
    const go1 = v128.or(f64x2.le(f64x2.add(xx1, yy1), r), v128.load(DONE, 16));
    const go2 = v128.or(f64x2.le(f64x2.add(xx2, yy2), r), v128.load(DONE, 32));
    const go3 = v128.or(f64x2.le(f64x2.add(xx3, yy3), r), v128.load(DONE, 48));
    if (i64x2.bitmask(v128.and(v128.and(go0, go1), v128.and(go2, go3))) != 3) {
      settleVector(base, v128.not(go0), n, x0, y0, xx0, yy0, r2, false, 0);
      settleVector(base + 2, v128.not(go1), n, x1, y1, xx1, yy1, r2, false, 0);
      settleVector(base + 4, v128.not(go2), n, x2, y2, xx2, yy2, r2, false, 0);
      settleVector(base + 6, v128.not(go3), n, x3, y3, xx3, yy3, r2, false, 0);
      v128.store(DONE, v128.or(v128.load(DONE), v128.not(go0)));
      v128.store(DONE, v128.or(v128.load(DONE, 16), v128.not(go1)), 16);
      v128.store(DONE, v128.or(v128.load(DONE, 32), v128.not(go2)), 32);
      v128.store(DONE, v128.or(v128.load(DONE, 48), v128.not(go3)), 48);
      if (allDone()) return;
    }
    if (fast && slow == 0 && n + BLOCK <= maxIterations) {
      // BLOCK steps with no test, then one test: an escaped lane stays
      // escaped (|z| > R >= 2 and |c| <= R give |z^2 + c| > R^2 - R >= R),
      // and an overflow to infinity or NaN fails the test as well, so if every
      // lane passes at the end, every lane passed at each step. Otherwise the
      // state is restored and the same steps are taken one at a time.
      v128.store(SAVE, x0); v128.store(SAVE, y0, 16); v128.store(SAVE, xx0, 32); v128.store(SAVE, yy0, 48);
      v128.store(SAVE, x1, 64); v128.store(SAVE, y1, 80); v128.store(SAVE, xx1, 96); v128.store(SAVE, yy1, 112);
      v128.store(SAVE, x2, 128); v128.store(SAVE, y2, 144); v128.store(SAVE, xx2, 160); v128.store(SAVE, yy2, 176);
      v128.store(SAVE, x3, 192); v128.store(SAVE, y3, 208); v128.store(SAVE, xx3, 224); v128.store(SAVE, yy3, 240);
      for (let k = 0; k < BLOCK; k++) {
        y0 = f64x2.add(f64x2.mul(f64x2.add(x0, x0), y0), ci0);
        y1 = f64x2.add(f64x2.mul(f64x2.add(x1, x1), y1), ci1);
        y2 = f64x2.add(f64x2.mul(f64x2.add(x2, x2), y2), ci2);
        y3 = f64x2.add(f64x2.mul(f64x2.add(x3, x3), y3), ci3);
        x0 = f64x2.add(f64x2.sub(xx0, yy0), cr0);
        x1 = f64x2.add(f64x2.sub(xx1, yy1), cr1);
        x2 = f64x2.add(f64x2.sub(xx2, yy2), cr2);
        x3 = f64x2.add(f64x2.sub(xx3, yy3), cr3);
        xx0 = f64x2.mul(x0, x0); yy0 = f64x2.mul(y0, y0);
        xx1 = f64x2.mul(x1, x1); yy1 = f64x2.mul(y1, y1);
        xx2 = f64x2.mul(x2, x2); yy2 = f64x2.mul(y2, y2);
        xx3 = f64x2.mul(x3, x3); yy3 = f64x2.mul(y3, y3);
      }
      const b0 = v128.or(f64x2.le(f64x2.add(xx0, yy0), r), v128.load(DONE));
      const b1 = v128.or(f64x2.le(f64x2.add(xx1, yy1), r), v128.load(DONE, 16));
      const b2 = v128.or(f64x2.le(f64x2.add(xx2, yy2), r), v128.load(DONE, 32));
      const b3 = v128.or(f64x2.le(f64x2.add(xx3, yy3), r), v128.load(DONE, 48));
      if (i64x2.bitmask(v128.and(v128.and(b0, b1), v128.and(b2, b3))) == 3) {
        n += BLOCK;
        continue;
      }
      x0 = v128.load(SAVE); y0 = v128.load(SAVE, 16); xx0 = v128.load(SAVE, 32); yy0 = v128.load(SAVE, 48);
      x1 = v128.load(SAVE, 64); y1 = v128.load(SAVE, 80); xx1 = v128.load(SAVE, 96); yy1 = v128.load(SAVE, 112);
      x2 = v128.load(SAVE, 128); y2 = v128.load(SAVE, 144); xx2 = v128.load(SAVE, 160); yy2 = v128.load(SAVE, 176);
      x3 = v128.load(SAVE, 192); y3 = v128.load(SAVE, 208); xx3 = v128.load(SAVE, 224); yy3 = v128.load(SAVE, 240);
      slow = BLOCK;
    }
    if (slow > 0) slow--;
    y0 = f64x2.add(f64x2.mul(f64x2.add(x0, x0), y0), ci0);
    y1 = f64x2.add(f64x2.mul(f64x2.add(x1, x1), y1), ci1);
    y2 = f64x2.add(f64x2.mul(f64x2.add(x2, x2), y2), ci2);
    y3 = f64x2.add(f64x2.mul(f64x2.add(x3, x3), y3), ci3);
    x0 = f64x2.add(f64x2.sub(xx0, yy0), cr0);
    x1 = f64x2.add(f64x2.sub(xx1, yy1), cr1);
    x2 = f64x2.add(f64x2.sub(xx2, yy2), cr2);
    x3 = f64x2.add(f64x2.sub(xx3, yy3), cr3);
    xx0 = f64x2.mul(x0, x0); yy0 = f64x2.mul(y0, y0);
    xx1 = f64x2.mul(x1, x1); yy1 = f64x2.mul(y1, y1);
    xx2 = f64x2.mul(x2, x2); yy2 = f64x2.mul(y2, y2);
    xx3 = f64x2.mul(x3, x3); yy3 = f64x2.mul(y3, y3);
    n++;
  }
  settleVector(base, v128.not(v128.load(DONE)), n, x0, y0, xx0, yy0, r2, false, 0);
  settleVector(base + 2, v128.not(v128.load(DONE, 16)), n, x1, y1, xx1, yy1, r2, false, 0);
  settleVector(base + 4, v128.not(v128.load(DONE, 32)), n, x2, y2, xx2, yy2, r2, false, 0);
  settleVector(base + 6, v128.not(v128.load(DONE, 48)), n, x3, y3, xx3, yy3, r2, false, 0);
}

function group8Cycle(base: i32, count: i32, start: i32, maxIterations: i32, r2: f64, tolerance2: f64): void {
  const p = CR + (<usize>base << 3), q = CI + (<usize>base << 3);
  const cr0 = v128.load(p), cr1 = v128.load(p, 16), cr2 = v128.load(p, 32), cr3 = v128.load(p, 48);
  const ci0 = v128.load(q), ci1 = v128.load(q, 16), ci2 = v128.load(q, 32), ci3 = v128.load(q, 48);
  const r = f64x2.splat(r2), t = f64x2.splat(tolerance2);
  v128.store(DONE, padding(base, count));
  v128.store(DONE, padding(base + 2, count), 16);
  v128.store(DONE, padding(base + 4, count), 32);
  v128.store(DONE, padding(base + 6, count), 48);
  const zr = ZRE + (<usize>base << 3), zi = ZIM + (<usize>base << 3);
  let x0 = v128.load(zr), y0 = v128.load(zi), xx0 = f64x2.mul(x0, x0), yy0 = f64x2.mul(y0, y0), sx0 = x0, sy0 = y0;
  let x1 = v128.load(zr, 16), y1 = v128.load(zi, 16), xx1 = f64x2.mul(x1, x1), yy1 = f64x2.mul(y1, y1), sx1 = x1, sy1 = y1;
  let x2 = v128.load(zr, 32), y2 = v128.load(zi, 32), xx2 = f64x2.mul(x2, x2), yy2 = f64x2.mul(y2, y2), sx2 = x2, sy2 = y2;
  let x3 = v128.load(zr, 48), y3 = v128.load(zi, 48), xx3 = f64x2.mul(x3, x3), yy3 = f64x2.mul(y3, y3), sx3 = x3, sy3 = y3;
  // At a schedule point the saved point is the current z (for start 0, z = 0 itself).
  let n = start, saved = start, next = start == 0 ? 1 : start << 1;
  while (n < maxIterations) {
    const go0 = v128.or(f64x2.le(f64x2.add(xx0, yy0), r), v128.load(DONE));
    const go1 = v128.or(f64x2.le(f64x2.add(xx1, yy1), r), v128.load(DONE, 16));
    const go2 = v128.or(f64x2.le(f64x2.add(xx2, yy2), r), v128.load(DONE, 32));
    const go3 = v128.or(f64x2.le(f64x2.add(xx3, yy3), r), v128.load(DONE, 48));
    if (i64x2.bitmask(v128.and(v128.and(go0, go1), v128.and(go2, go3))) != 3) {
      settleVector(base, v128.not(go0), n, x0, y0, xx0, yy0, r2, false, 0);
      settleVector(base + 2, v128.not(go1), n, x1, y1, xx1, yy1, r2, false, 0);
      settleVector(base + 4, v128.not(go2), n, x2, y2, xx2, yy2, r2, false, 0);
      settleVector(base + 6, v128.not(go3), n, x3, y3, xx3, yy3, r2, false, 0);
      v128.store(DONE, v128.or(v128.load(DONE), v128.not(go0)));
      v128.store(DONE, v128.or(v128.load(DONE, 16), v128.not(go1)), 16);
      v128.store(DONE, v128.or(v128.load(DONE, 32), v128.not(go2)), 32);
      v128.store(DONE, v128.or(v128.load(DONE, 48), v128.not(go3)), 48);
      if (allDone()) return;
    }
    y0 = f64x2.add(f64x2.mul(f64x2.add(x0, x0), y0), ci0);
    y1 = f64x2.add(f64x2.mul(f64x2.add(x1, x1), y1), ci1);
    y2 = f64x2.add(f64x2.mul(f64x2.add(x2, x2), y2), ci2);
    y3 = f64x2.add(f64x2.mul(f64x2.add(x3, x3), y3), ci3);
    x0 = f64x2.add(f64x2.sub(xx0, yy0), cr0);
    x1 = f64x2.add(f64x2.sub(xx1, yy1), cr1);
    x2 = f64x2.add(f64x2.sub(xx2, yy2), cr2);
    x3 = f64x2.add(f64x2.sub(xx3, yy3), cr3);
    xx0 = f64x2.mul(x0, x0); yy0 = f64x2.mul(y0, y0);
    xx1 = f64x2.mul(x1, x1); yy1 = f64x2.mul(y1, y1);
    xx2 = f64x2.mul(x2, x2); yy2 = f64x2.mul(y2, y2);
    xx3 = f64x2.mul(x3, x3); yy3 = f64x2.mul(y3, y3);
    n++;
    const ex0 = f64x2.sub(x0, sx0), ey0 = f64x2.sub(y0, sy0);
    const ex1 = f64x2.sub(x1, sx1), ey1 = f64x2.sub(y1, sy1);
    const ex2 = f64x2.sub(x2, sx2), ey2 = f64x2.sub(y2, sy2);
    const ex3 = f64x2.sub(x3, sx3), ey3 = f64x2.sub(y3, sy3);
    const hit0 = v128.andnot(f64x2.lt(f64x2.add(f64x2.mul(ex0, ex0), f64x2.mul(ey0, ey0)), t), v128.load(DONE));
    const hit1 = v128.andnot(f64x2.lt(f64x2.add(f64x2.mul(ex1, ex1), f64x2.mul(ey1, ey1)), t), v128.load(DONE, 16));
    const hit2 = v128.andnot(f64x2.lt(f64x2.add(f64x2.mul(ex2, ex2), f64x2.mul(ey2, ey2)), t), v128.load(DONE, 32));
    const hit3 = v128.andnot(f64x2.lt(f64x2.add(f64x2.mul(ex3, ex3), f64x2.mul(ey3, ey3)), t), v128.load(DONE, 48));
    if (i64x2.bitmask(v128.or(v128.or(hit0, hit1), v128.or(hit2, hit3))) != 0) {
      const cycle = n - saved;
      settleVector(base, hit0, n, x0, y0, xx0, yy0, r2, true, cycle);
      settleVector(base + 2, hit1, n, x1, y1, xx1, yy1, r2, true, cycle);
      settleVector(base + 4, hit2, n, x2, y2, xx2, yy2, r2, true, cycle);
      settleVector(base + 6, hit3, n, x3, y3, xx3, yy3, r2, true, cycle);
      v128.store(DONE, v128.or(v128.load(DONE), hit0));
      v128.store(DONE, v128.or(v128.load(DONE, 16), hit1), 16);
      v128.store(DONE, v128.or(v128.load(DONE, 32), hit2), 32);
      v128.store(DONE, v128.or(v128.load(DONE, 48), hit3), 48);
      if (allDone()) return;
    }
    if (n == next) {
      sx0 = x0; sy0 = y0; sx1 = x1; sy1 = y1;
      sx2 = x2; sy2 = y2; sx3 = x3; sy3 = y3;
      saved = n;
      next <<= 1;
    }
  }
  settleVector(base, v128.not(v128.load(DONE)), n, x0, y0, xx0, yy0, r2, false, 0);
  settleVector(base + 2, v128.not(v128.load(DONE, 16)), n, x1, y1, xx1, yy1, r2, false, 0);
  settleVector(base + 4, v128.not(v128.load(DONE, 32)), n, x2, y2, xx2, yy2, r2, false, 0);
  settleVector(base + 6, v128.not(v128.load(DONE, 48)), n, x3, y3, xx3, yy3, r2, false, 0);
}
