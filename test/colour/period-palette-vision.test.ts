import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { linearToOklab, linearToSrgb, oklabDistance } from '../../src/colour/oklab.js';
import { PERIOD_GREYSCALE_DISTINCT, periodHex, periodLinear } from '../../src/colour/period-palette.js';
import { luminance, MACHADO_2009, simulateVision, VISION_KINDS, type VisionKind } from '../../src/colour/vision-simulation.js';
import { requireInCi } from '../helpers/require-in-ci.js';

/** How many periods must stay apart for each colour-vision deficiency (the claim in period-palette.ts). */
const CVD_PERIODS = 12;
/**
 * OKLab threshold: 0.06 = three just-noticeable differences, with the JND of
 * 0.02 in deltaEOK that CSS Color Module Level 4 uses in its gamut mapping.
 */
const OKLAB_APART = 0.06;
/** Greyscale: the same 0.06 in OKLab lightness of the luminance grey. */
const GREY_APART = 0.06;

const simulated = (kind: VisionKind | 'normal', p: number): number[] => {
  const c = periodLinear(p, [0, 0, 0]) as number[];
  const s = kind === 'normal' ? c : (simulateVision(kind, c[0]!, c[1]!, c[2]!, [0, 0, 0]) as number[]);
  return linearToOklab(s[0]!, s[1]!, s[2]!, [0, 0, 0]) as number[];
};

const greyL = (p: number): number => {
  const c = periodLinear(p, [0, 0, 0]) as number[];
  const y = luminance(c[0]!, c[1]!, c[2]!);
  return linearToOklab(y, y, y, [0, 0, 0])[0]!;
};

function closestPair(n: number, d: (p: number, q: number) => number): { d: number; pair: string } {
  let best = { d: Infinity, pair: '' };
  for (let p = 1; p <= n; p++) for (let q = 1; q < p; q++) if (d(p, q) < best.d) best = { d: d(p, q), pair: `${q}-${p}` };
  return best;
}

describe('period palette under simulated colour-vision deficiencies and greyscale', () => {
  it('the Machado 2009 severity-1.0 matrices keep white and greys: every row sums to 1 (to the published 6 decimals)', () => {
    for (const kind of VISION_KINDS) for (const row of MACHADO_2009[kind]) expect(Math.abs(row[0] + row[1] + row[2] - 1)).toBeLessThan(2e-6);
  });

  it(`periods 1..${CVD_PERIODS} are pairwise at least ${OKLAB_APART} apart in OKLab for normal vision, protanopia, deuteranopia and tritanopia`, () => {
    for (const kind of ['normal', ...VISION_KINDS] as const) {
      const worst = closestPair(CVD_PERIODS, (p, q) => oklabDistance(simulated(kind, p), simulated(kind, q)));
      expect(worst.d, `${kind}: periods ${worst.pair}`).toBeGreaterThanOrEqual(OKLAB_APART);
    }
  });

  it(`periods 1..${PERIOD_GREYSCALE_DISTINCT} are pairwise at least ${GREY_APART} apart in greyscale lightness`, () => {
    const worst = closestPair(PERIOD_GREYSCALE_DISTINCT, (p, q) => Math.abs(greyL(p) - greyL(q)));
    expect(worst.d, `periods ${worst.pair}`).toBeGreaterThanOrEqual(GREY_APART);
  });

  // An independent implementation and an independent colour difference:
  // colorspacious (Debian python3-colorspacious) simulates the deficiencies
  // from Machado et al.'s model at severity 100 and measures differences in
  // CAM02-UCS (M. R. Luo, G. Cui, C. Li, "Uniform colour spaces based on
  // CIECAM02 colour appearance model", Color Res. Appl. 31 (2006) 320-330), in
  // whose units about 1 is a just-noticeable difference (from memory).
  const python = '/usr/bin/python3';
  const haveColorspacious = requireInCi(spawnSync(python, ['-c', 'import colorspacious'], { stdio: 'ignore' }).status === 0, 'python3-colorspacious');
  const CAM02_APART = 6;
  const script = `
import sys, json, itertools, numpy as np
from colorspacious import cspace_convert, deltaE
rgb = np.array([[int(h[i:i+2], 16) / 255 for i in (1, 3, 5)] for h in sys.argv[1].split(',')])
grey = int(sys.argv[2])
out = {}
for kind in ['protanomaly', 'deuteranomaly', 'tritanomaly']:
    s = np.clip(cspace_convert(rgb, {"name": "sRGB1+CVD", "cvd_type": kind, "severity": 100}, "sRGB1"), 0, 1)
    out[kind] = {"sim": s.tolist(), "min": min(float(deltaE(s[i], s[j], input_space="sRGB1")) for i, j in itertools.combinations(range(len(s)), 2))}
L = cspace_convert(rgb, "sRGB1", "CIELab")[:, 0]
out["greyLstar"] = min(abs(float(L[i] - L[j])) for i, j in itertools.combinations(range(grey), 2))
print(json.dumps(out))
`;
  const run = (hexes: string[]): Record<string, { sim: number[][]; min: number }> & { greyLstar: number } => {
    const py = spawnSync(python, ['-c', script, hexes.join(','), String(PERIOD_GREYSCALE_DISTINCT)], { encoding: 'utf8' });
    expect(py.stderr).toBe('');
    return JSON.parse(py.stdout) as Record<string, { sim: number[][]; min: number }> & { greyLstar: number };
  };
  const KINDS = { protanopia: 'protanomaly', deuteranopia: 'deuteranomaly', tritanopia: 'tritanomaly' } as const;

  it.skipIf(!haveColorspacious)('colorspacious simulates the palette as we do (each sRGB channel within 0.004)', () => {
    const hexes = Array.from({ length: CVD_PERIODS }, (_, i) => periodHex(i + 1));
    const ref = run(hexes);
    for (const kind of VISION_KINDS) {
      for (let p = 1; p <= CVD_PERIODS; p++) {
        const c = periodLinear(p, [0, 0, 0]) as number[];
        const ours = (simulateVision(kind, c[0]!, c[1]!, c[2]!, [0, 0, 0]) as number[]).map(linearToSrgb);
        // 0.004: the hex colours colorspacious reads are rounded to 8 bits (half a step is 0.002) before simulation.
        for (let ch = 0; ch < 3; ch++) expect(Math.abs(ours[ch]! - ref[KINDS[kind]]!.sim[p - 1]![ch]!), `${kind} period ${p}`).toBeLessThan(0.004);
      }
    }
  });

  it.skipIf(!haveColorspacious)(
    `colorspacious: periods 1..${CVD_PERIODS} at least ${CAM02_APART} CAM02-UCS units apart for each deficiency, 1..${PERIOD_GREYSCALE_DISTINCT} at least 6 in L*`,
    () => {
      const ref = run(Array.from({ length: CVD_PERIODS }, (_, i) => periodHex(i + 1)));
      for (const kind of Object.values(KINDS)) expect(ref[kind]!.min, kind).toBeGreaterThanOrEqual(CAM02_APART);
      expect(ref.greyLstar).toBeGreaterThanOrEqual(6);
    },
  );

  it.skipIf(!haveColorspacious)('the check has teeth: the palette before the colour-vision change fails it', () => {
    // Periods 1..12 of the palette built for normal vision only (quadatlas before this change).
    const before = ['#4bc39f', '#c94b8a', '#fbc2f5', '#297fe3', '#e76c2a', '#f5d73f', '#c68ef7', '#a17922', '#5588a2', '#fbcda9', '#f87ab5', '#539423'];
    const ref = run(before);
    expect(Math.min(...Object.values(KINDS).map((k) => ref[k]!.min))).toBeLessThan(CAM02_APART);
    expect(ref.greyLstar).toBeLessThan(6);
  });
});
