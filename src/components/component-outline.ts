/**
 * The boundary of one hyperbolic component as a closed curve, in double
 * precision: the points where the attracting cycle's multiplier is
 * e^{2 pi i theta}, theta = j / n, by Newton on the 2 x 2 system of
 * docs/methods.md C3 (cycle point w and parameter b):
 *   F^p(w, b) = w,  D_z F^p(w, b) = t,  t = r e^{2 pi i theta}.
 * The walk starts at the nucleus (w = 0, t = 0), raises r to 1 at
 * theta = 1/2 (away from the root, where a satellite's system is singular),
 * then follows the boundary both ways towards theta = 0, continuing from the
 * neighbour each time and halving the step when Newton fails. The root
 * itself (theta = 0) is left to the caller (componentRoot, which handles the
 * singular case); the curve here stops one step short on each side.
 * Source: C. Heiland-Allen, mathr.co.uk/web/m-interior-point.html (as C3).
 */

/** Newton from (w, b) for multiplier t; writes the solution into `out` [wr, wi, br, bi] and returns whether it converged. */
export function boundaryNewton(period: number, start: ArrayLike<number>, tr: number, ti: number, out: Float64Array): boolean {
  let wr = start[0]!;
  let wi = start[1]!;
  let br = start[2]!;
  let bi = start[3]!;
  for (let it = 0; it < 40; it += 1) {
    let zr = wr,
      zi = wi;
    let ar = 1,
      ai = 0; // D_z
    let cr = 0,
      ci = 0; // D_c
    let aar = 0,
      aai = 0; // D_zz
    let acr = 0,
      aci = 0; // D_cz
    for (let n = 0; n < period; n += 1) {
      // second derivatives first: they use this step's z, D_z, D_c
      const naar = 2 * (ar * ar - ai * ai + zr * aar - zi * aai);
      const naai = 2 * (2 * ar * ai + zr * aai + zi * aar);
      const nacr = 2 * (cr * ar - ci * ai + zr * acr - zi * aci);
      const naci = 2 * (cr * ai + ci * ar + zr * aci + zi * acr);
      const nar = 2 * (zr * ar - zi * ai);
      const nai = 2 * (zr * ai + zi * ar);
      const ncr = 2 * (zr * cr - zi * ci) + 1;
      const nci = 2 * (zr * ci + zi * cr);
      const nzr = zr * zr - zi * zi + br;
      zi = 2 * zr * zi + bi;
      zr = nzr;
      [aar, aai, acr, aci, ar, ai, cr, ci] = [naar, naai, nacr, naci, nar, nai, ncr, nci];
    }
    // f = F^p - w, g = D_z - t; Jacobian [[D_z - 1, D_c], [D_zz, D_cz]]
    const fr = zr - wr,
      fi = zi - wi;
    const gr = ar - tr,
      gi = ai - ti;
    const mr = ar - 1,
      mi = ai;
    const detr = mr * acr - mi * aci - (cr * aar - ci * aai);
    const deti = mr * aci + mi * acr - (cr * aai + ci * aar);
    const dm = detr * detr + deti * deti;
    if (!(dm > 0) || !Number.isFinite(dm)) return false;
    // db = ((D_z - 1) g - D_zz f) / det, dw = (D_cz f - D_c g) / det
    const nbr = mr * gr - mi * gi - (aar * fr - aai * fi);
    const nbi = mr * gi + mi * gr - (aar * fi + aai * fr);
    const nwr = acr * fr - aci * fi - (cr * gr - ci * gi);
    const nwi = acr * fi + aci * fr - (cr * gi + ci * gr);
    const dbr = (nbr * detr + nbi * deti) / dm;
    const dbi = (nbi * detr - nbr * deti) / dm;
    const dwr = (nwr * detr + nwi * deti) / dm;
    const dwi = (nwi * detr - nwr * deti) / dm;
    if (!Number.isFinite(dbr + dbi + dwr + dwi)) return false;
    br -= dbr;
    bi -= dbi;
    wr -= dwr;
    wi -= dwi;
    if (Math.hypot(dbr, dbi) <= 1e-15 * Math.max(1, Math.hypot(br, bi)) && Math.hypot(dwr, dwi) <= 1e-15 * Math.max(1, Math.hypot(wr, wi))) {
      out[0] = wr;
      out[1] = wi;
      out[2] = br;
      out[3] = bi;
      return true;
    }
  }
  out[0] = wr;
  out[1] = wi;
  out[2] = br;
  out[3] = bi;
  // accept a settled point even when the last step did not reach the tolerance (near the root Newton is linear)
  return Number.isFinite(br + bi) && Math.hypot(br - start[2]!, bi - start[3]!) < 1;
}

/**
 * Boundary points of the period-p component with nucleus (nr, ni) at
 * theta = j / n for j = 1 .. n - 1, as c values (re, im, ...) in order of
 * theta; null when the walk fails.
 */
export function componentOutline(period: number, nr: number, ni: number, n: number): Float64Array | null {
  const state = new Float64Array([0, 0, nr, ni]);
  const next = new Float64Array(4);
  // raise r from 0 to 1 at theta = 1/2 (t = -r)
  for (let k = 1; k <= 16; k += 1) {
    if (!boundaryNewton(period, state, -k / 16, 0, next)) return null;
    state.set(next);
  }
  const half = Math.floor(n / 2);
  const out = new Float64Array(2 * (n - 1));
  const walk = (from: number, to: number, dir: number): boolean => {
    const s = Float64Array.from(state);
    let j = from;
    let theta = from / n;
    let step = dir / n;
    while (dir > 0 ? j <= to : j >= to) {
      const target = j / n;
      const tryTheta = dir > 0 ? Math.min(target, theta + step) : Math.max(target, theta + step);
      if (!boundaryNewton(period, s, Math.cos(2 * Math.PI * tryTheta), Math.sin(2 * Math.PI * tryTheta), next)) {
        step /= 2;
        if (Math.abs(step) < 1 / (n * 4096)) return false;
        continue;
      }
      s.set(next);
      theta = tryTheta;
      if (theta === target) {
        out[2 * (j - 1)] = s[2]!;
        out[2 * (j - 1) + 1] = s[3]!;
        j += dir;
        step = dir / n;
      }
    }
    return true;
  };
  if (!walk(half, n - 1, 1)) return null;
  if (!walk(half - 1, 1, -1)) return null;
  return out;
}
