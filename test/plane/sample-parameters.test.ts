import { describe, expect, it } from 'vitest';
import { attractingCycle } from '../../src/plane/attracting-cycle.js';
import { LOOP_CYCLE, escapeLoop } from '../../src/plane/escape-loop.js';
import type { EscapeLoop } from '../../src/plane/escape-loop.js';
import { interiorDistance } from '../../src/plane/interior-distance.js';
import { DEFAULT_ESCAPE_RADIUS, MAX_ESCAPE_RADIUS, createSampleScratch, sampleParameters } from '../../src/plane/sample-parameters.js';
import { createSampleSet } from '../../src/plane/sample-set.js';
import type { EscapeSettings, SampleSet } from '../../src/plane/sample-set.js';

const SETTINGS: EscapeSettings = { maxIterations: 10000, escapeRadius: DEFAULT_ESCAPE_RADIUS, periodTolerance: 1e-10 };

function run(points: readonly (readonly [number, number])[], settings: EscapeSettings = SETTINGS, loop: EscapeLoop = escapeLoop): SampleSet {
  const cr = Float64Array.from(points, (p) => p[0]);
  const ci = Float64Array.from(points, (p) => p[1]);
  return sampleParameters(cr, ci, points.length, settings, createSampleSet(points.length), loop);
}

/** c = m/2 - m^2/4 for m = r e^{i t} (main cardioid formula, docs/checks.md). */
function cardioidPoint(r: number, t: number): [number, number] {
  const mr = r * Math.cos(t),
    mi = r * Math.sin(t);
  return [mr / 2 - (mr * mr - mi * mi) / 4, mi / 2 - (mr * mi) / 2];
}

/** c = -1 + m/4 for m = r e^{i t} (period-2 disk, multiplier 4(c + 1), docs/checks.md). */
function diskPoint(r: number, t: number): [number, number] {
  return [-1 + (r * Math.cos(t)) / 4, (r * Math.sin(t)) / 4];
}

/** Distance from c to the main cardioid's boundary curve, by dense sampling and golden-section refinement. */
function distanceToCardioid(x: number, y: number): number {
  const at = (t: number) => Math.hypot(x - (Math.cos(t) / 2 - Math.cos(2 * t) / 4), y - (Math.sin(t) / 2 - Math.sin(2 * t) / 4));
  const K = 20000;
  let best = 0;
  for (let k = 1; k < K; k++) if (at((2 * Math.PI * k) / K) < at((2 * Math.PI * best) / K)) best = k;
  let lo = (2 * Math.PI * (best - 1)) / K,
    hi = (2 * Math.PI * (best + 1)) / K;
  const g = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 100; i++) {
    const u = hi - g * (hi - lo),
      v = lo + g * (hi - lo);
    if (at(u) < at(v)) hi = v;
    else lo = u;
  }
  return at((lo + hi) / 2);
}

// Period-3 nuclei: roots of c^3 + 2c^2 + c + 1 (exact polynomial; OEIS A060006
// gives the plastic number rho, real root -rho^2), digits from docs/checks.md.
const NUCLEI3 = [
  [-1.75487766624669276, 0],
  [-0.12256116687665361998, 0.74486176661974423659],
  [-0.12256116687665361998, -0.74486176661974423659],
] as const;

const ANGLES = Array.from({ length: 12 }, (_, k) => (2 * Math.PI * (k + 0.5)) / 12);

describe('sampleParameters', () => {
  it('sampleParameters(period-3 nuclei) reports period 3 with multiplier ~ 0', () => {
    const out = run(NUCLEI3);
    for (let k = 0; k < 3; k++) {
      expect(out.period[k]).toBe(3);
      // Exact multiplier 0 at a nucleus (the cycle contains z = 0); 1e-12 allows rounding.
      expect(Math.hypot(out.mulRe[k]!, out.mulIm[k]!)).toBeLessThan(1e-12);
      expect(out.distance[k]).toBeGreaterThan(0);
    }
  });

  it('sampleParameters reports period 1, 2, 3 and 4 well inside the cardioid, period-2 disk, 1/3 bulb and period-doubling disk', () => {
    // c4 = -1.31070264133683288356: superstable period 4 (docs/methods.md E2 [checked]);
    // the period-4 disk spans about [-1.3681, -1.25] (docs/checks.md: a_3 = 1.3680989, -5/4).
    const [n1r, n1i] = NUCLEI3[1];
    const cases: [number, number, number][] = [
      [0, 0, 1],
      [0.1, 0.3, 1],
      [-0.5, -0.4, 1],
      [-1, 0, 2],
      [-1.1, 0.1, 2],
      [-0.9, -0.12, 2],
      [n1r + 0.02, n1i, 3],
      [n1r - 0.01, n1i + 0.015, 3],
      [n1r, -n1i - 0.02, 3],
      [-1.7549, 0.001, 3],
      [-1.3107026413368329, 0, 4],
      [-1.3, 0.01, 4],
      [-1.32, -0.02, 4],
    ];
    const out = run(cases.map(([a, b]) => [a, b]));
    cases.forEach(([, , p], k) => {
      expect(out.period[k]).toBe(p);
      expect(Math.hypot(out.mulRe[k]!, out.mulIm[k]!)).toBeLessThan(1);
    });
  });

  it('sampleParameters(c = m/2 - m^2/4) returns multiplier m; (c in the period-2 disk) returns 4(c + 1)', () => {
    const ms: [number, number][] = [
      [0.5, 0],
      [0.3, -0.6],
      [-0.9, 0.1],
      [0.05, 0.95],
      [-0.2, -0.2],
      [0.97, 0.1],
    ];
    const cs = ms.map(([mr, mi]) => [mr / 2 - (mr * mr - mi * mi) / 4, mi / 2 - (mr * mi) / 2] as const);
    const out = run(cs);
    ms.forEach(([mr, mi], k) => {
      expect(out.period[k]).toBe(1);
      // m = 1 - sqrt(1 - 4c) recovered from a rounded c: 1e-13.
      expect(out.mulRe[k]).toBeCloseTo(mr, 13);
      expect(out.mulIm[k]).toBeCloseTo(mi, 13);
    });
    const ds: [number, number][] = [
      [-1.2, 0.05],
      [-0.8, -0.1],
      [-1, 0.2],
      [-0.95, 0],
    ];
    const dout = run(ds);
    ds.forEach(([a, b], k) => {
      expect(dout.period[k]).toBe(2);
      expect(dout.mulRe[k]).toBeCloseTo(4 * (a + 1), 14);
      expect(dout.mulIm[k]).toBeCloseTo(4 * b, 14);
    });
  });

  it('sampleParameters just inside the cardioid and disk (|m| = 0.98) gives periods 1 and 2; just outside (|m| = 1.02) neither', () => {
    const inside = [...ANGLES.map((t) => cardioidPoint(0.98, t)), ...ANGLES.map((t) => diskPoint(0.98, t))];
    const out = run(inside);
    inside.forEach((_, k) => expect(out.period[k]).toBe(k < ANGLES.length ? 1 : 2));
    // Outside: angles with |2 - m| > 1 too (m and 2 - m give the same c).
    const card = ANGLES.filter((t) => t > 0.2 && t < 2 * Math.PI - 0.2).map((t) => cardioidPoint(1.02, t));
    const disk = ANGLES.map((t) => diskPoint(1.02, t));
    const oc = run(card),
      od = run(disk);
    card.forEach((_, k) => expect(oc.period[k]).not.toBe(1));
    disk.forEach((_, k) => expect(od.period[k]).not.toBe(2));
    // At least some are found in neighbouring bulbs (e.g. period 3 beyond m = e^{2 pi i/3}), some escape.
    expect([...oc.period, ...od.period].some((p) => p > 2)).toBe(true);
    expect([...oc.period, ...od.period].some((p) => p === 0)).toBe(true);
  });

  it('sampleParameters(conjugate c) gives bit-identical period, smooth count and distance, and the conjugate multiplier', () => {
    const pts: [number, number][] = [];
    for (let j = 0; j < 40; j++) for (let i = 0; i < 60; i++) pts.push([-2.2 + (2.8 * (i + 0.37)) / 60, 0.013 + (1.3 * j) / 40]);
    const a = run(pts),
      b = run(pts.map(([x, y]) => [x, -y]));
    let interior = 0,
      escaped = 0;
    for (let k = 0; k < pts.length; k++) {
      expect(b.period[k]).toBe(a.period[k]);
      expect(b.smooth[k]).toBe(a.smooth[k]);
      expect(b.distance[k]).toBe(a.distance[k]);
      expect(b.mulRe[k]).toBe(a.mulRe[k]);
      expect(b.mulIm[k]! + 0).toBe(-a.mulIm[k]! + 0); // + 0 folds -0 into 0 for the zero multipliers
      if (a.period[k]! > 0) interior++;
      if (a.period[k] === 0) escaped++;
    }
    expect(interior).toBeGreaterThan(100);
    expect(escaped).toBeGreaterThan(100);
  });

  it('sampleParameters exterior distance b brackets the true distance: b/4 < dist < b (Milnor, docs/methods.md A2)', () => {
    // Left of -2: M lies in |c| <= 2 and contains -2, so dist(-2 - t, M) = t exactly.
    const ts = [0.5, 0.1, 0.05, 0.01, 1e-3, 1e-4];
    const left = run(ts.map((t) => [-2 - t, 0]));
    ts.forEach((t, k) => {
      expect(left.period[k]).toBe(0);
      expect(left.distance[k]! / 4).toBeLessThan(t);
      expect(left.distance[k]!).toBeGreaterThan(t);
    });
    // Right of the cardioid's cusp: dist to the cardioid curve (computed numerically
    // from c = e^{it}/2 - e^{2it}/4) is an upper bound of dist(c, M); at these points
    // the decorations near the cusp are far smaller than the distance, so it is the distance
    // to within them (checked: the ratio dist/b stays in 0.73..0.90 here).
    const right: [number, number][] = [
      [0.35, 0],
      [0.4, 0],
      [0.5, 0],
      [0.45, 0.1],
      [0.4, 0.05],
    ];
    const out = run(right);
    right.forEach(([x, y], k) => {
      const d = distanceToCardioid(x, y);
      expect(out.period[k]).toBe(0);
      expect(out.distance[k]! / 4).toBeLessThan(d);
      expect(out.distance[k]!).toBeGreaterThan(d);
    });
  });

  it('sampleParameters interior distance at c = -1 is 0.25 and agrees with the Newton path inside the cardioid and disk', () => {
    // docs/methods.md A6 [checked]: c = -1, p = 2 gives b = 0.25, the disk radius.
    expect(run([[-1, 0]]).distance[0]).toBe(0.25);
    const pts = [...ANGLES.map((t) => cardioidPoint(0.7, t)), ...ANGLES.map((t) => diskPoint(0.7, t))];
    const out = run(pts);
    pts.forEach(([a, b], k) => {
      const p = out.period[k]!;
      const r = attractingCycle(a, b, p, 0, 0);
      expect(r.ok).toBe(true);
      // Closed-form cycle point vs Newton's: same formula, so agreement to rounding (1e-12 relative).
      expect(out.distance[k]! / interiorDistance(a, b, r.wRe, r.wIm, p)).toBeCloseTo(1, 12);
    });
  });

  it('sampleParameters smooth count is continuous along lines outside M (max neighbour jump << 1), unlike with R = 2', () => {
    // docs/methods.md A1: with a large R the bands join; R = 2 leaves seams.
    const lines = [
      [0.3, 0, 1.0, 0],
      [0.5, -1, 0.5, 1],
    ] as const;
    for (const [x0, y0, x1, y1] of lines) {
      const K = 3001;
      const pts = Array.from({ length: K }, (_, k) => [x0 + ((x1 - x0) * k) / (K - 1), y0 + ((y1 - y0) * k) / (K - 1)] as const);
      const jump = (R: number) => {
        const out = run(pts, { ...SETTINGS, escapeRadius: R });
        let max = 0,
          bands = 0;
        for (let k = 1; k < K; k++) {
          expect(out.period[k]).toBe(0);
          max = Math.max(max, Math.abs(out.smooth[k]! - out.smooth[k - 1]!));
          if (Math.floor(out.smooth[k]!) !== Math.floor(out.smooth[k - 1]!)) bands++;
        }
        return { max, bands };
      };
      const big = jump(DEFAULT_ESCAPE_RADIUS);
      expect(big.bands).toBeGreaterThan(5); // the line crosses band boundaries
      expect(big.max).toBeLessThan(0.05);
      expect(jump(2).max).toBeGreaterThan(0.1);
    }
  });

  it('sampleParameters(escapeRadius = MAX_ESCAPE_RADIUS) keeps smooth count and distance finite, the distance within 1 % of R = 2^16', () => {
    // The largest R whose escaped |z|^2 stays finite; a larger R (e.g. 1e100) overflows to Infinity.
    const pts: [number, number][] = [
      [1, 0],
      [-2.1, 0],
      [0.3, 0],
      [2, 2],
      [-0.75, 0.1],
    ];
    const big = run(pts, { ...SETTINGS, escapeRadius: MAX_ESCAPE_RADIUS });
    const usual = run(pts);
    pts.forEach((_, k) => {
      expect(big.period[k]).toBe(0);
      expect(Number.isFinite(big.smooth[k])).toBe(true);
      expect(Number.isFinite(big.distance[k])).toBe(true);
      // Distance sharpens with R (A2); here it moves by under 1 % from R = 2^16.
      expect(big.distance[k]! / usual.distance[k]!).toBeCloseTo(1, 2);
    });
  });

  it('sampleParameters never gives a period to the Misiurewicz points c = i and c = -2 (docs/checks.md)', () => {
    for (const tolerance of [1e-10, 1e-3, 0]) {
      const out = run(
        [
          [0, 1],
          [-2, 0],
          [0, -1],
        ],
        { ...SETTINGS, periodTolerance: tolerance },
      );
      for (let k = 0; k < 3; k++) expect(out.period[k]).toBeLessThanOrEqual(0);
    }
  });

  it('sampleParameters with a loose tolerance (false cycle hits) resumes and gives the same exterior results as without checking', () => {
    // A box in the valley between the cardioid and the period-2 disk: many slow escapers.
    const pts: [number, number][] = [];
    for (let j = 0; j < 30; j++) for (let i = 0; i < 30; i++) pts.push([-0.8 + (0.1 * i) / 30, 0.05 + (0.1 * j) / 30]);
    const hit = new Set<string>();
    const spy: EscapeLoop = (cr, ci, count, maxIterations, escapeRadius2, tolerance2, out) => {
      escapeLoop(cr, ci, count, maxIterations, escapeRadius2, tolerance2, out);
      for (let k = 0; k < count; k++) if (out.status[k] === LOOP_CYCLE) hit.add(`${cr[k]},${ci[k]}`);
    };
    const loose = run(pts, { ...SETTINGS, maxIterations: 3000, periodTolerance: 0.05 }, spy);
    const none = run(pts, { ...SETTINGS, maxIterations: 3000, periodTolerance: 0 });
    let escaped = 0,
      resumed = 0;
    pts.forEach(([a, b], k) => {
      if (none.period[k] === 0) {
        escaped++;
        if (hit.has(`${a},${b}`)) resumed++;
        expect(loose.period[k]).toBe(0);
        expect(loose.smooth[k]).toBe(none.smooth[k]);
        expect(loose.distance[k]).toBe(none.distance[k]);
      }
    });
    expect(escaped).toBeGreaterThan(100);
    expect(resumed).toBeGreaterThan(10); // the resume path was exercised
  });

  it('sampleParameters passes only the samples outside the closed-form components to the loop, in one batch', () => {
    const calls: number[] = [];
    const spy: EscapeLoop = (cr, ci, count, ...rest) => {
      calls.push(count);
      escapeLoop(cr, ci, count, ...rest);
    };
    run(
      [
        [0, 0],
        [-1, 0],
        [0.3, 0],
        [-1.75, 0.01],
        [0.1, 0.2],
        [1, 1],
      ],
      SETTINGS,
      spy,
    );
    expect(calls).toEqual([3]);
  });

  it('sampleParameters gives the same bytes for a sample whatever the batch, order or scratch', () => {
    const pts: [number, number][] = [];
    for (let k = 0; k < 300; k++) pts.push([-2.1 + 2.6 * ((k * 0.618034) % 1), 1.2 * ((k * 0.7548777) % 1)]);
    const whole = run(pts);
    const scratch = createSampleScratch(7);
    const one = createSampleSet(1);
    for (let k = pts.length - 1; k >= 0; k--) {
      sampleParameters(Float64Array.of(pts[k]![0]), Float64Array.of(pts[k]![1]), 1, SETTINGS, one, escapeLoop, scratch);
      expect([one.period[0], one.smooth[0], one.distance[0], one.mulRe[0], one.mulIm[0]]).toEqual([
        whole.period[k],
        whole.smooth[k],
        whole.distance[k],
        whole.mulRe[k],
        whole.mulIm[k],
      ]);
    }
  });

  it('sampleParameters on a 256 x 256 grid: period-1 and period-2 cells add up to the cardioid and disk areas, all non-escaped cells to the area of M', () => {
    // Exact areas: main cardioid 3 pi / 8, period-2 disk pi / 16 (exact geometry).
    // Area of M: 1.5065918849 +/- 2.8e-9 (T. Forstemann 2012, docs/checks.md). Cell
    // counting at spacing h = 2.5/256 errs by a fraction of perimeter * h; the
    // tolerances below (0.005 for the smooth curves of perimeter 4 and pi/2,
    // 0.02 for M, whose undecided boundary cells count as inside) are that bound.
    const W = 256,
      h = 2.5 / W;
    const cr = new Float64Array(W),
      ci = new Float64Array(W);
    for (let i = 0; i < W; i++) cr[i] = -2 + h * (i + 0.5);
    const out = createSampleSet(W),
      scratch = createSampleScratch(W);
    const settings = { maxIterations: 1000, escapeRadius: DEFAULT_ESCAPE_RADIUS, periodTolerance: 1e-3 * h };
    let p1 = 0,
      p2 = 0,
      inside = 0;
    for (let j = 0; j < W; j++) {
      ci.fill(1.25 - h * (j + 0.5));
      sampleParameters(cr, ci, W, settings, out, escapeLoop, scratch);
      for (let i = 0; i < W; i++) {
        const p = out.period[i]!;
        if (p === 1) p1++;
        if (p === 2) p2++;
        if (p !== 0) inside++;
      }
    }
    expect(Math.abs(p1 * h * h - (3 * Math.PI) / 8)).toBeLessThan(0.005);
    expect(Math.abs(p2 * h * h - Math.PI / 16)).toBeLessThan(0.005);
    expect(Math.abs(inside * h * h - 1.5065918849)).toBeLessThan(0.02);
  });
});
