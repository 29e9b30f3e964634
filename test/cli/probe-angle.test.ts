import { describe, expect, it } from 'vitest';
import { traceRayDouble, RAY_RADIUS } from '../../src/components/trace-ray.js';
import { runCli } from '../helpers/run-cli.js';

interface ProbeOut {
  externalAngle: { binary: string; digits: number; certainDigits: number; turns: number } | null;
  potential: number;
  plateCommand: string;
}

function probe(re: number, im: number, bits: number): ProbeOut {
  const r = runCli(['probe', '--json', '--angle-bits', String(bits), '--', `${re},${im}`]);
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout) as ProbeOut;
}

/** The binary expansion of n/d to `len` digits, by long division (exact). */
function binary(n: number, d: number, len: number): string {
  let s = '';
  let x = n;
  for (let i = 0; i < len; i += 1) {
    x *= 2;
    s += x >= d ? '1' : '0';
    if (x >= d) x -= d;
  }
  return s;
}

describe('probe: external angle of an exterior c, traced outward (docs/methods.md D5)', () => {
  for (const [n, d] of [
    [1, 3],
    [1, 7],
    [5, 12],
  ] as const) {
    for (const depth of [10, 24]) {
      it(`a point of the ${n}/${d} ray at depth ${depth} reads ${binary(n, d, 8)}... for at least ${depth} digits`, () => {
        // the point: the inward tracer (D4) run to `depth` levels, where |F^depth(0, c)| = sqrt(RAY_RADIUS)
        const end = traceRayDouble(n, d, depth, 8);
        expect(end.ok).toBe(true);
        const out = probe(end.reHi, end.imHi, 64);
        const a = out.externalAngle!;
        expect(a.binary.slice(2, 2 + depth)).toBe(binary(n, d, depth));
        expect(a.certainDigits).toBeGreaterThanOrEqual(depth);
        // the certain digits agree with n/d as far as the tracer put the point on the ray:
        // its last level leaves |F| = sqrt(R), a Böttcher error of about |c|/|F|^2 (~2^-16) at level depth
        expect(a.binary.slice(2, 2 + depth + 8)).toBe(binary(n, d, depth + 8));
        // potential: G = log |Phi| = log sqrt(R) / 2^(depth-1) on the tracer's last level (Böttcher)
        expect(out.potential / (Math.log(Math.sqrt(RAY_RADIUS)) / 2 ** (depth - 1))).toBeCloseTo(1, 3);
      });
    }
  }

  it('a large c: the angle is arg c / 2 pi to the Böttcher error |c|^-1 (Phi_M(c) = c + O(1))', () => {
    const out = probe(3000, 4000, 40);
    expect(out.externalAngle!.turns).toBeCloseTo(Math.atan2(4000, 3000) / (2 * Math.PI), 3);
    expect(out.potential).toBeCloseTo(Math.log(5000), 3);
  });

  it('an interior point with --angle-bits: one line naming the field, exit 2', () => {
    const r = runCli(['probe', '--angle-bits', '20', '--', '-0.5,0.1']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('--angle-bits');
  });

  it('prints the plate command that frames c', () => {
    const out = probe(-0.8, 0.4, 16);
    expect(out.plateCommand).toMatch(/^quadatlas plate --center -0\.8,0\.4 --span \S+ --iterations auto$/);
  });
});
