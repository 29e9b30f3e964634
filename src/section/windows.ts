/**
 * The periodic windows of a unimodal family on its parameter line, one per
 * MSS word of period p (docs/methods.md E4, E5): the onset (saddle-node,
 * multiplier +1; for a period-doubled window the parent's doubling point),
 * the superstable parameter, the first period doubling (multiplier -1) and
 * the end of the whole window, the interior crisis where the critical orbit
 * lands on the window's repelling cycle: f^(3p)(x_c) = f^(2p)(x_c).
 *
 * Each superstable parameter is found first by bisection on the kneading
 * order (the kneading sequence increases with the parameter, so the word
 * fixes the parameter; docs/methods.md E5 and Milnor-Thurston 1988), then refined
 * by Newton at full precision. The other three points start from the local
 * renormalisation v -> v^2 + C of localRenormalisation: onset at C = 1/4,
 * doubling at C = -3/4, end at C = -2 (docs/methods.md C4, E4). The end is
 * bracketed by walking outward from the doubling point and bisecting,
 * because the nucleus solves the crisis equation trivially (docs/methods.md E4).
 * Families with a maximum of order other than 2 are refused: their windows
 * renormalise to v -> v^m + C, with other landmarks.
 */
import type { Decimal } from 'decimal.js';
import { compareItineraries, mssWords, satelliteParent } from './kneading.js';
import { localRenormalisation, multiplierParameter, orbitCoincidence, superstableParameter, workingDecimal } from './real-newton.js';
import type { DecimalCtor, UnimodalFamily } from './unimodal-family.js';
import { ConvergenceError } from '../check/fields.js';

export interface PeriodicWindow {
  period: number;
  /** MSS word (itinerary of x_1 .. x_{p-1}). */
  word: string;
  /** True when the window is the period doubling of a window of period p/2. */
  satellite: boolean;
  onset: Decimal;
  superstable: Decimal;
  doubling: Decimal;
  end: Decimal;
  /** Renormalisation scale 1/(K L) in parameter units: r ~ r_s + scale * C. */
  scale: Decimal;
}

/** Itinerary of x_1 .. x_n of the critical orbit in double precision. */
export function criticalItinerary(family: UnimodalFamily, r: number, n: number): string {
  const xc = Number(family.critical);
  let x = xc;
  let s = '';
  for (let i = 0; i < n; i++) {
    x = family.f(x, r);
    s += x > xc ? 'R' : x < xc ? 'L' : 'C';
  }
  return s;
}

/** Bisection in double precision for the parameter whose kneading begins with word C. */
export function bisectWord(family: UnimodalFamily, word: string): number {
  const target = `${word}C`;
  let lo = Number(family.range[0]);
  let hi = Number(family.range[1]);
  for (let i = 0; i < 200 && hi - lo > 4e-16 * Math.abs(hi); i++) {
    const mid = (lo + hi) / 2;
    const cmp = compareItineraries(criticalItinerary(family, mid, target.length), target);
    if (cmp === 0) return mid;
    if (cmp > 0) hi = mid;
    else lo = mid;
  }
  return (lo + hi) / 2;
}

function crisisGapDouble(family: UnimodalFamily, r: number, p: number): number {
  let x = Number(family.critical);
  let x2p = x;
  for (let k = 1; k <= 3 * p; k++) {
    x = family.f(x, r);
    if (k === 2 * p) x2p = x;
  }
  return x - x2p;
}

/**
 * The window end, roughly, as a decimal string for Newton to finish: the
 * crisis gap f^(3p)(x_c) - f^(2p)(x_c) changes sign there. Walk outward from
 * the doubling point in steps of scale/32, then bisect to a millionth of the
 * window. The critical orbit is expanded by up to about 2 per step near
 * r = 4, so 3p steps in doubles lose about 3p bits, and the narrowest
 * windows of period p are about 4^-p wide, below the spacing of doubles near
 * 4 from period 13 on: up to period 8 the walk runs in doubles, beyond in
 * decimal.js with 3p bits and the window's digits to spare.
 */
function bracketEnd(family: UnimodalFamily, p: number, doubling: Decimal, scale: Decimal): string {
  const D = p <= 8 ? null : workingDecimal(Math.ceil(3 * p * Math.log10(2)) + 20 + Math.max(0, -scale.abs().log(10).floor().toNumber()));
  const gap = (r: Decimal | number): number => {
    if (D === null) return crisisGapDouble(family, Number(r), p);
    const rr = new D(r);
    let x = new D(family.critical);
    let x2p = x;
    for (let k = 1; k <= 3 * p; k++) {
      x = family.value(x, rr, D);
      if (k === 2 * p) x2p = x;
    }
    return x.minus(x2p).toNumber();
  };
  const W = D ?? workingDecimal(20);
  const rEnd = new W(family.range[1]);
  const step = new W(scale).abs().div(32);
  const dir = scale.isNegative() ? 1 : -1;
  let a = new W(doubling);
  if (D === null) a = new W(a.toNumber());
  let ha = gap(D === null ? a.toNumber() : a);
  // C runs from -3/4 to about -4 (the size estimate is a few per cent off).
  for (let i = 0; i < 32 * 4; i++) {
    let b = a.plus(step.times(dir));
    if (b.minus(rEnd).times(dir).gt(0)) b = rEnd;
    if (D === null) b = new W(b.toNumber());
    const hb = gap(D === null ? b.toNumber() : b);
    if (hb === 0) return b.toString();
    if (Math.sign(hb) !== Math.sign(ha)) {
      const tol = step.times(32e-6);
      for (let k = 0; k < 200 && b.minus(a).abs().gt(tol); k++) {
        const m = a.plus(b).div(2);
        const hm = gap(D === null ? m.toNumber() : m);
        if (Math.sign(hm) === Math.sign(ha)) {
          a = m;
          ha = hm;
        } else b = m;
      }
      return a.plus(b).div(2).toString();
    }
    if (b.eq(rEnd)) break;
    a = b;
    ha = hb;
  }
  throw new ConvergenceError(`no window end found for period ${p}`);
}

function must(ok: boolean, what: string): void {
  if (!ok) throw new ConvergenceError(what);
}

/** Every window of period 1..maxPeriod, in increasing order of the parameter. */
export function findWindows(
  family: UnimodalFamily,
  maxPeriod: number,
  digits: number,
  onPeriod?: (period: number, windows: number) => void,
): { windows: PeriodicWindow[]; D: DecimalCtor } {
  if (family.maximumOrder !== 2) throw new RangeError(`windows need a quadratic maximum; ${family.name} has order ${family.maximumOrder}`);
  const D = workingDecimal(digits);
  const byWord = new Map<string, PeriodicWindow>();
  const xc = new D(family.critical);
  for (let p = 1; p <= maxPeriod; p++) {
    for (const word of mssWords(p)) {
      const rough = p === 1 ? Number(family.range[0]) : bisectWord(family, word);
      const sup = superstableParameter(family, p, rough.toPrecision(17), digits);
      must(sup.converged, `superstable parameter of ${word || 'C'} (period ${p}) did not converge`);
      const rs = sup.r;
      const { k, l } = localRenormalisation(family, p, rs, D);
      const scale = new D(1).div(k.times(l));
      const parentWord = p > 1 ? satelliteParent(word) : undefined;
      let onset: Decimal;
      if (parentWord !== undefined) {
        onset = byWord.get(parentWord)!.doubling;
      } else if (p === 1) {
        onset = new D(family.fixedPointOnset);
      } else {
        const on = multiplierParameter(family, p, 1, rs.plus(scale.div(4)).toString(), xc.plus(new D('0.5').div(k)).toString(), digits);
        must(on.converged, `onset of ${word || 'C'} (period ${p}) did not converge`);
        onset = on.r;
      }
      const dbl = multiplierParameter(family, p, -1, rs.minus(scale.times(0.75)).toString(), xc.minus(new D('0.5').div(k)).toString(), digits);
      must(dbl.converged, `first doubling of ${word || 'C'} (period ${p}) did not converge`);
      let end: Decimal;
      if (p === 1) end = new D(family.range[1]);
      else {
        const rough = bracketEnd(family, p, dbl.r, scale);
        const e = orbitCoincidence(family, 3 * p, 2 * p, rough, digits);
        must(e.converged, `end of ${word} (period ${p}) did not converge`);
        end = e.r;
      }
      // onset < superstable < doubling < end along increasing kneading.
      must(onset.lt(rs) && rs.lt(dbl.r) && dbl.r.lte(end), `window ${word || 'C'} (period ${p}) came out of order`);
      byWord.set(word, { period: p, word, satellite: parentWord !== undefined, onset, superstable: rs, doubling: dbl.r, end, scale });
    }
    onPeriod?.(p, byWord.size);
  }
  const windows = [...byWord.values()].sort((a, b) => a.superstable.comparedTo(b.superstable));
  return { windows, D };
}
