/**
 * `--certify` for `components` and `locate`: runs the certificates
 * (src/components/certify/) and reports them. A nucleus whose certificate
 * fails is named on stderr and the exit code is 1; it is never printed as
 * if it were proved.
 */
import type { CensusResult } from '../components/census.js';
import type { ComponentInfo } from '../components/component-info.js';
import { certifyCensus } from '../components/certify/certify-census.js';
import { certifyNucleusDecimal } from '../components/certify/certify-decimal.js';
import { certifyRootDecimal } from '../components/certify/certify-root.js';
import { UserError } from '../check/user-error.js';
import { createProgress } from '../render/progress.js';

/** Largest period of a certified census: every disk is kept in memory (about 400 bytes each). */
export const MAX_CERTIFY_PERIOD = 22;

/** What a certificate needs of --digits: the printed point must lie well inside the component (its size times 2^-12). */
export function digitsNeeded(log10Size: number): number {
  return Math.max(1, Math.ceil(-log10Size + 12 * Math.log10(2) + 1));
}

/** Certifies the census of `result` and says so on stderr; sets exit code 1 when the proof fails. */
export async function reportCensusCertificate(result: CensusResult, workers: number, progressJson = false): Promise<{ ok: boolean; seconds: number }> {
  const t0 = performance.now();
  const progress = createProgress(`period ${result.period}: certifying`, { json: progressJson, unit: 'nuclei', phase: 'certifying', delayMs: 1000 });
  const cert = await certifyCensus(result, { workers, onProgress: (d, t) => progress.update(d, t) });
  progress.end();
  const seconds = Number(((performance.now() - t0) / 1000).toFixed(2));
  const p = result.period;
  if (cert.ok) {
    process.stderr.write(
      `period ${p}: certified: ${cert.found} pairwise disjoint disks, each holding exactly one zero of F_${p} of exact period ${p}; ` +
        `sum over d | ${p} of mu(${p}/d) 2^(d-1) = ${cert.expected}, so the list is complete (${seconds} s)\n`,
    );
  } else {
    process.exitCode = 1;
    for (const f of cert.failures.slice(0, 20)) {
      const c = result.components[f.index]!;
      process.stderr.write(`quadatlas: period ${p}: nucleus near ${c.reHi}, ${c.imHi} not certified: ${f.reason}\n`);
    }
    if (cert.failures.length > 20) process.stderr.write(`quadatlas: period ${p}: ${cert.failures.length - 20} more nuclei not certified\n`);
    if (cert.overlap !== null) {
      const [a, b] = cert.overlap.map((i) => result.components[i]!);
      process.stderr.write(`quadatlas: period ${p}: the disks about ${a!.reHi}, ${a!.imHi} and ${b!.reHi}, ${b!.imHi} were not proved disjoint\n`);
    }
    if (BigInt(cert.found) !== cert.expected) {
      process.stderr.write(`quadatlas: period ${p}: the census has ${cert.found} components but F_${p} has ${cert.expected} zeros of exact period ${p}: not proved complete\n`);
    }
  }
  return { ok: cert.ok, seconds };
}

/** Certified radius (or "uncertified") per listed row; throws a UserError when --digits cannot reach a certificate. */
export function certifyListing(period: number, rows: readonly ComponentInfo[], digits: number): string[] {
  const smallest = rows.reduce((m, r) => Math.min(m, r.log10Size), Infinity);
  if (rows.length > 0 && digits < digitsNeeded(smallest)) {
    throw new UserError('digits', `at least ${digitsNeeded(smallest)} digits with --certify (the smallest component listed has size 1e${smallest.toFixed(1)})`, digits);
  }
  return rows.map((r) => {
    const cert = certifyNucleusDecimal(period, r.nucleus);
    if (cert.ok) return cert.radius!;
    process.exitCode = 1;
    process.stderr.write(`quadatlas: period ${period}: nucleus ${r.nucleus.re}, ${r.nucleus.im} not certified: ${cert.reason}\n`);
    return 'uncertified';
  });
}

/** Certificates of a located component's nucleus (and root, when that certificate exists) as JSON fields and text lines. */
export function certifyLocated(info: ComponentInfo, digits: number): { json: Record<string, unknown>; lines: string[] } {
  if (digits < digitsNeeded(info.log10Size)) {
    throw new UserError('digits', `at least ${digitsNeeded(info.log10Size)} digits with --certify (the component has size 1e${info.log10Size.toFixed(1)})`, digits);
  }
  const cert = certifyNucleusDecimal(info.period, info.nucleus);
  if (!cert.ok) {
    process.exitCode = 1;
    process.stderr.write(`quadatlas: period ${info.period}: nucleus ${info.nucleus.re}, ${info.nucleus.im} not certified: ${cert.reason}\n`);
  }
  let root: { ok: boolean; radius: string | null; reason: string | null; satellite: boolean };
  try {
    root = certifyRootDecimal(info.period, info.nucleus, info.root, digits);
  } catch (err) {
    root = { ok: false, radius: null, reason: (err as Error).message, satellite: info.parent !== null };
  }
  if (!root.ok) {
    process.exitCode = 1;
    process.stderr.write(`quadatlas: period ${info.period}: root ${info.root.re}, ${info.root.im} could not be certified: ${root.reason}\n`);
  }
  const what =
    info.parent === null
      ? `exactly one parameter within it where a cycle of exact period ${info.period} has multiplier 1`
      : `exactly one parameter within it where the parent's ${info.parent.period}-cycle has multiplier e^(2 pi i ${info.parent.num}/${info.parent.den})`;
  return {
    json: { certifiedRadius: cert.ok ? cert.radius : null, rootCertifiedRadius: root.ok ? root.radius : null },
    lines: [
      `certified radius  ${cert.ok ? `${cert.radius} (exactly one zero of F_${info.period} within it, of exact period ${info.period})` : `none: ${cert.reason}`}`,
      `root certified    ${root.ok ? `${root.radius} (${what})` : `no: ${root.reason}`}`,
    ],
  };
}
