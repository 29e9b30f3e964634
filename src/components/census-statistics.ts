/**
 * Statistics of a census, accumulated one component at a time as the census
 * produces them (no second pass, nothing kept per component): the count, the
 * real ones, primitive and satellite components (and satellites by the
 * period of their parent), a histogram of the size estimates in decades, and
 * the sum of the estimated areas (docs/methods.md C6).
 *
 * Primitive or satellite is read from the angle pair alone (combinatorics,
 * not the shape estimate): at the root of a satellite of period p = kq on a
 * component of period k, the q rays landing at the characteristic point are
 * permuted cyclically by doubling^k, so both angles of the pair lie on one
 * doubling cycle; at a primitive root every ray is fixed by doubling^p and
 * the two angles lie on two different cycles (J. Milnor, "Periodic orbits,
 * external rays and the Mandelbrot set", Asterisque 261 (2000), the
 * primitive / satellite dichotomy of orbit portraits). Doubling a numerator
 * over 2^p - 1 rotates its p-bit string (docs/methods.md D1), so the test is
 * whether the upper numerator is a rotation of the lower one; the smallest
 * rotation m that maps one onto the other gives the parent's period gcd(m, p).
 */

/** One bin of the size histogram: sizes s with 10^log10From <= s < 10^(log10From + 1). */
export interface SizeBin {
  readonly log10From: number;
  readonly count: number;
}

export interface CensusStatistics {
  readonly period: number;
  readonly count: number;
  readonly real: number;
  readonly primitive: number;
  readonly satellite: number;
  /** Satellites by their parent's period k (a proper divisor of the period), as { "k": count }. */
  readonly satellitesByParentPeriod: Readonly<Record<string, number>>;
  /** Size estimates |s| in decades, ascending. */
  readonly sizeHistogram: readonly SizeBin[];
  /** Sum of the estimated areas: (3 pi / 8) |s|^2 for primitive components, (pi / 4) |s|^2 for satellites (docs/methods.md C6). */
  readonly areaEstimate: number;
}

function gcd(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

/**
 * The period of the parent of the component whose root has angles lo/den,
 * hi/den (den = 2^p - 1), or 0 when the component is primitive: the smallest
 * m in 1..p-1 with 2^m lo = hi (mod den) gives gcd(m, p).
 */
export function satelliteParentPeriod(period: number, lo: number, hi: number): number {
  const den = 2 ** period - 1;
  let n = lo;
  for (let m = 1; m < period; m++) {
    n = 2 * n >= den ? 2 * n - den : 2 * n;
    if (n === hi) return gcd(m, period);
  }
  return 0;
}

/**
 * Where a satellite hangs, from its angle pair alone: the parent's period k
 * (satelliteParentPeriod) and the internal angle r/q, q = p/k, or null for a
 * primitive component. The q rays 2^(km) lo (m = 0..q-1) land together at the
 * characteristic point of the root, and the k-th iterate of doubling moves
 * them round in circular order by r places: the combinatorial rotation number
 * r/q, which is the internal angle of the root on the parent (the parent's
 * k-cycle has multiplier e^(2 pi i r/q) there; Milnor, "Periodic orbits,
 * external rays and the Mandelbrot set", 2000, section 2; docs/methods.md C6).
 */
export function satelliteAttachment(period: number, lo: number, hi: number): { k: number; r: number; q: number } | null {
  const k = satelliteParentPeriod(period, lo, hi);
  if (k === 0) return null;
  const den = 2 ** period - 1;
  const q = period / k;
  const rays: number[] = [];
  let n = lo;
  for (let m = 0; m < q; m++) {
    rays.push(n);
    for (let j = 0; j < k; j++) n = 2 * n >= den ? 2 * n - den : 2 * n;
  }
  // rays[1] is the image of lo under the k-th iterate; its place after lo's in circular order is r
  const sorted = [...rays].sort((a, b) => a - b);
  const r = (((sorted.indexOf(rays[1]!) - sorted.indexOf(lo)) % q) + q) % q;
  return { k, r, q };
}

/** Estimated area of a component of size estimate `size`: (3 pi / 8) s^2 for a primitive one, (pi / 4) s^2 for a satellite (docs/methods.md C6). */
export function componentAreaEstimate(size: number, satellite: boolean): number {
  return (satellite ? Math.PI / 4 : (3 * Math.PI) / 8) * size * size;
}

/** Accumulates the statistics of the components of one period, in the order the census gives them. */
export class CensusStatisticsAccumulator {
  private count = 0;
  private real = 0;
  private satellite = 0;
  private area = 0;
  private areaCarry = 0;
  private readonly parents = new Map<number, number>();
  private readonly bins = new Map<number, number>();

  constructor(readonly period: number) {}

  /** Adds one component: its root's angle numerators (ascending; one for the cardioid), realness and size estimate. */
  add(angles: readonly number[], real: boolean, size: number): void {
    this.count += 1;
    if (real) this.real += 1;
    const parent = angles.length === 2 ? satelliteParentPeriod(this.period, angles[0]!, angles[1]!) : 0;
    if (parent > 0) {
      this.satellite += 1;
      this.parents.set(parent, (this.parents.get(parent) ?? 0) + 1);
    }
    const bin = size > 0 ? Math.floor(Math.log10(size)) : -Infinity;
    this.bins.set(bin, (this.bins.get(bin) ?? 0) + 1);
    // compensated (Kahan) sum: a period-24 census adds eight million terms spanning thirty decades
    const y = componentAreaEstimate(size, parent > 0) - this.areaCarry;
    const t = this.area + y;
    this.areaCarry = t - this.area - y;
    this.area = t;
  }

  result(): CensusStatistics {
    const parents = [...this.parents.entries()].sort((a, b) => a[0] - b[0]);
    return {
      period: this.period,
      count: this.count,
      real: this.real,
      primitive: this.count - this.satellite,
      satellite: this.satellite,
      satellitesByParentPeriod: Object.fromEntries(parents.map(([k, n]) => [String(k), n])),
      sizeHistogram: [...this.bins.entries()].sort((a, b) => a[0] - b[0]).map(([log10From, count]) => ({ log10From, count })),
      areaEstimate: this.area,
    };
  }
}
