// Exact decimal numbers for the survey page: value = m * 10^e with m a BigInt.
// The page keeps the view's centre and pixel spacing in these and never in
// doubles, so the pointer readout has every digit the zoom needs at any depth.

/** @typedef {{ m: bigint, e: number }} Dec */

const TEN = 10n;

/** @returns {Dec} */
export function dec(m, e = 0) {
  return { m: BigInt(m), e };
}

/** Parses "-0.75", ".5", "3.2e-20"; returns null for anything else. */
export function parse(text) {
  const t = String(text).trim();
  const g = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(t);
  if (g === null || (g[2] === '' && (g[3] ?? '') === '')) return null;
  const frac = g[3] ?? '';
  const digits = (g[2] + frac).replace(/^0+(?=\d)/, '') || '0';
  const m = BigInt(digits) * (g[1] === '-' ? -1n : 1n);
  return trim({ m, e: Number(g[4] ?? '0') - frac.length });
}

/** Removes trailing zeros of the mantissa. */
export function trim(a) {
  if (a.m === 0n) return { m: 0n, e: 0 };
  let { m, e } = a;
  while (m % TEN === 0n) {
    m /= TEN;
    e += 1;
  }
  return { m, e };
}

function align(a, b) {
  const e = Math.min(a.e, b.e);
  return [a.m * TEN ** BigInt(a.e - e), b.m * TEN ** BigInt(b.e - e), e];
}

export function add(a, b) {
  const [x, y, e] = align(a, b);
  return trim({ m: x + y, e });
}

export function sub(a, b) {
  return add(a, { m: -b.m, e: b.e });
}

export function mul(a, b) {
  return trim({ m: a.m * b.m, e: a.e + b.e });
}

export function mulInt(a, k) {
  return trim({ m: a.m * BigInt(k), e: a.e });
}

/** a * 2^-k exactly (2^-k = 5^k 10^-k). */
export function mulPow2(a, k) {
  if (k >= 0) return trim({ m: a.m * 5n ** BigInt(k), e: a.e - k });
  return trim({ m: a.m * 2n ** BigInt(-k), e: a.e });
}

export function compare(a, b) {
  const [x, y] = align(a, b);
  return x < y ? -1 : x > y ? 1 : 0;
}

export function isZero(a) {
  return a.m === 0n;
}

function digitsOf(m) {
  return (m < 0n ? -m : m).toString().length;
}

/** Rounds half away from zero to a multiple of 10^e0. */
export function roundTo(a, e0) {
  if (a.e >= e0) return a;
  const q = TEN ** BigInt(e0 - a.e);
  const neg = a.m < 0n;
  const abs = neg ? -a.m : a.m;
  let r = abs / q;
  if ((abs % q) * 2n >= q) r += 1n;
  return trim({ m: neg ? -r : r, e: e0 });
}

/** Rounds to n significant digits. */
export function roundSignificant(a, n) {
  if (a.m === 0n) return a;
  return roundTo(a, a.e + digitsOf(a.m) - n);
}

/** floor(log10 |a|) (a != 0). */
export function magnitude(a) {
  return a.e + digitsOf(a.m) - 1;
}

/**
 * a / b to n significant digits, exact when the quotient has at most n
 * digits (the rounding is half away from zero).
 */
export function divide(a, b, n = 30) {
  if (b.m === 0n) throw new Error('division by zero');
  if (a.m === 0n) return a;
  const shift = Math.max(0, n + digitsOf(b.m) - digitsOf(a.m) + 1);
  const num = a.m * TEN ** BigInt(shift);
  const q = num / b.m;
  const exact = num % b.m === 0n;
  const r = { m: q, e: a.e - b.e - shift };
  return exact && digitsOf(q) <= n + 1 ? trim(r) : roundSignificant(r, n);
}

/** The ratio a / b as a double (both may be far beyond the double range). */
export function ratio(a, b) {
  const lead = (x) => {
    const s = (x.m < 0n ? -x.m : x.m).toString();
    const k = Math.min(17, s.length);
    return [(x.m < 0n ? -1 : 1) * Number(s.slice(0, k)), x.e + s.length - k];
  };
  if (a.m === 0n) return 0;
  const [ma, ea] = lead(a);
  const [mb, eb] = lead(b);
  return (ma / mb) * 10 ** (ea - eb);
}

/** A double approximation (for widths on screen, never for coordinates). */
export function toNumber(a) {
  return Number(`${a.m}e${a.e}`);
}

/** Plain text with exactly `places` digits after the point (rounded). */
export function toFixed(a, places) {
  const r = roundTo(a, -places);
  const neg = r.m < 0n;
  let s = (neg ? -r.m : r.m).toString();
  const e = r.e + places;
  s += '0'.repeat(Math.max(0, e));
  if (places === 0) return (neg ? '-' : '') + s;
  s = s.padStart(places + 1, '0');
  return `${neg ? '-' : ''}${s.slice(0, s.length - places)}.${s.slice(s.length - places)}`;
}

/** Shortest exact text: plain for moderate exponents, else d.ddde-N. */
export function toText(a) {
  const t = trim(a);
  if (t.m === 0n) return '0';
  const mag = magnitude(t);
  if (mag >= -7 && mag < 21) return toFixed(t, Math.max(0, -t.e));
  const neg = t.m < 0n;
  const s = (neg ? -t.m : t.m).toString();
  return `${neg ? '-' : ''}${s[0]}${s.length > 1 ? `.${s.slice(1)}` : ''}e${mag}`;
}
