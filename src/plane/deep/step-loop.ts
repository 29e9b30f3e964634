/**
 * The deep kernel's step loop: perturbation steps with rebasing (B3),
 * bilinear-approximation skips (B5), rescaled iterations for tiny deltas
 * (B6b), the derivative for distance estimation (B8) and atom-domain minima
 * for the interior (A4). See sample-deep.ts for the method and its sources.
 */
import type { BlaTable } from './bla-table.js';
import { exponentOf, ldexp, pow2 } from '../../precise/floatexp.js';
import {
  DLI,
  DLR,
  type DeepStats,
  EV_ESCAPED,
  EV_NEWMIN,
  EV_STOP,
  FI,
  FK,
  FR,
  GI,
  GR,
  K,
  MINK,
  MINN,
  MIN_DROP,
  M_,
  N,
  type Orbit,
  PE,
  PI,
  PR,
  P_HIGH,
  P_LOW,
  SCALED_BELOW,
  WI,
  WR,
  W_HIGH,
  W_LOW,
  lessNorm,
  normalise,
} from './state.js';

/**
 * Advances the pixel until n = stopAt, escape, or (when `track`) a new
 * atom-domain minimum, or until the first step or skip that ends at or after
 * `pauseAt` (which, unlike stopAt, does not shorten skips). Returns EV_*. The
 * running product of 2 (Z_m + z_n) (D_z of the orbit since the last reset)
 * is kept in st[PR, PI] * 2^st[PE].
 */
export function run(
  o: Orbit,
  bla: BlaTable | null,
  st: Float64Array,
  stopAt: number,
  track: boolean,
  escapeRadius2: number,
  unitExponent: number,
  stats: DeepStats,
  pauseAt = Infinity,
): number {
  const re = o.re,
    im = o.im,
    M = o.M;
  let n = st[N]! | 0,
    m = st[M_]! | 0,
    k = st[K]! | 0;
  let wr = st[WR]!,
    wi = st[WI]!,
    gr = st[GR]!,
    gi = st[GI]!;
  let pr = st[PR]!,
    pi = st[PI]!,
    pe = st[PE]!;
  let fr = st[FR]!,
    fi = st[FI]!,
    fk = st[FK]!;
  let minN = st[MINN]!,
    minK = st[MINK]!;
  const dlr = st[DLR]!,
    dli = st[DLI]!;
  // plain mode holds |z| >= 2^-500, next to which u and c below 2^-1000 are
  // negligible; flushing them avoids slow subnormal arithmetic
  const u = unitExponent < -1000 ? 0 : ldexp(1, unitExponent);
  const pdr = dlr * u,
    pdi = dli * u;
  // rescaled-mode constants, refreshed whenever k changes
  // (no closure here: captured locals would live on the heap and slow the loop)
  let s = 1,
    sdr = pdr,
    sdi = pdi,
    hs = u,
    lim = 0;
  if (k !== 0) {
    s = k < -1000 ? 0 : ldexp(1, k);
    sdr = ldexp(dlr, unitExponent - k);
    sdi = ldexp(dli, unitExponent - k);
    hs = ldexp(1, unitExponent - k);
    lim = ldexp(1, k + 66);
  }
  let event = EV_STOP;
  let stepped = 0;
  while (n < stopAt) {
    // ------------------------------------------------------------ bilinear skip (B5), both modes
    let skipped = false;
    if (bla !== null && m >= 1) {
      // plain mode compares squares (radius2 is 0 where R^2 underflows, and
      // such radii are below the plain-mode |z| >= 2^-500); rescaled mode
      // compares logarithms
      const w2 = wr * wr + wi * wi;
      const logZ = k === 0 ? 0 : 0.5 * Math.log2(w2) + k;
      const maxSkip = stopAt - n;
      const minLimit = track && minK === 0 ? MIN_DROP * minN : 0;
      const kk = m - 1;
      const g = bla.dense;
      // radii never grow with the level at one start (bla-table.ts): where the
      // single step from m is not linear, no longer skip is, so one test
      // settles the steps of the nonlinear phase
      const e0 = bla.offsets[0]! + kk;
      const linear = kk < bla.counts[0]! && (k === 0 ? w2 < bla.radius2[e0]! : logZ < bla.logRadius[e0]!);
      let j = !linear ? -1 : kk === 0 ? bla.levels - 1 : Math.min(bla.levels - 1, g + 31 - Math.clz32(kk & -kk));
      for (; j >= 0; j--) {
        const i = kk >> (j > g ? j - g : 0);
        if (i >= bla.counts[j]!) continue;
        const e = bla.offsets[j]! + i;
        const l = bla.skip[e]!;
        if ((k === 0 ? w2 < bla.radius2[e]! : logZ < bla.logRadius[e]!) && l <= maxSkip && bla.minNorm[e]! >= minLimit) {
          let ar = bla.aRe[e]!,
            ai = bla.aIm[e]!;
          // B c and B u in the units of w: B 2^(U - k)
          let cr: number, ci: number, ur: number, ui: number;
          // rescaled mode: a large A (a long skip) goes into the scale 2^k
          // rather than into w, whose square and the product P would overflow
          let ea = 0;
          if (k === 0) {
            ur = bla.bTileRe[e]!;
            ui = bla.bTileIm[e]!;
            cr = ur * dlr - ui * dli;
            ci = ur * dli + ui * dlr;
          } else {
            const br = bla.bRe[e]!,
              bi = bla.bIm[e]!;
            const mag = Math.abs(ar) + Math.abs(ai);
            if (mag > W_HIGH) {
              ea = exponentOf(mag);
              ar = ldexp(ar, -ea);
              ai = ldexp(ai, -ea);
            }
            const fe = bla.bExp[e]! + unitExponent - k - ea;
            cr = br * dlr - bi * dli;
            ci = br * dli + bi * dlr;
            ur = br;
            ui = bi;
            if (fe >= -1022 && fe <= 1023) {
              const f = pow2(fe);
              cr *= f;
              ci *= f;
              ur *= f;
              ui *= f;
            } else {
              cr = ldexp(cr, fe);
              ci = ldexp(ci, fe);
              ur = ldexp(ur, fe);
              ui = ldexp(ui, fe);
            }
          }
          const nwr = ar * wr - ai * wi + cr;
          wi = ar * wi + ai * wr + ci;
          wr = nwr;
          const ngr = ar * gr - ai * gi + ur;
          gi = ar * gi + ai * gr + ui;
          gr = ngr;
          const npr = ar * pr - ai * pi;
          pi = ar * pi + ai * pr;
          pr = npr;
          n += l;
          m += l;
          stats.skipped += l;
          stats.skips += 1;
          skipped = true;
          if (ea !== 0) {
            pe += ea;
            st[K] = k + ea;
            st[WR] = wr;
            st[WI] = wi;
            st[GR] = gr;
            st[GI] = gi;
            normalise(st);
            k = st[K]! | 0;
            wr = st[WR]!;
            wi = st[WI]!;
            gr = st[GR]!;
            gi = st[GI]!;
            if (k !== 0) {
              s = k < -1000 ? 0 : ldexp(1, k);
              sdr = ldexp(dlr, unitExponent - k);
              sdi = ldexp(dli, unitExponent - k);
              hs = ldexp(1, unitExponent - k);
              lim = ldexp(1, k + 66);
            }
          }
          break;
        }
      }
    }
    if (k === 0) {
      // ---------------------------------------------------------------- plain mode
      if (!skipped) {
        const zr = re[m]!,
          zi = im[m]!;
        // derivative before z (A2): G <- 2 (Z + z) G + u, with Z + z = f
        const ngr = 2 * (fr * gr - fi * gi) + u;
        gi = 2 * (fr * gi + fi * gr);
        gr = ngr;
        const npr = 2 * (fr * pr - fi * pi);
        pi = 2 * (fr * pi + fi * pr);
        pr = npr;
        const nwr = 2 * (zr * wr - zi * wi) + (wr * wr - wi * wi) + pdr;
        wi = 2 * (zr * wi + zi * wr) + 2 * wr * wi + pdi;
        wr = nwr;
        n += 1;
        m += 1;
        stepped += 1;
      }
      const ar = Math.abs(pr) + Math.abs(pi);
      if (ar > P_HIGH || (ar < P_LOW && ar !== 0)) {
        const e = exponentOf(ar);
        pr = ldexp(pr, -e);
        pi = ldexp(pi, -e);
        pe += e;
      }
      fr = re[m]! + wr;
      fi = im[m]! + wi;
      fk = 0;
      const nf = fr * fr + fi * fi;
      if (nf > escapeRadius2) {
        event = EV_ESCAPED;
        break;
      }
      const nz = wr * wr + wi * wi;
      if (nf < nz || m === M) {
        wr = fr;
        wi = fi;
        m = 0;
        stats.rebases += 1;
        if (Math.abs(wr) + Math.abs(wi) < SCALED_BELOW) {
          st[K] = 0;
          st[WR] = wr;
          st[WI] = wi;
          st[GR] = gr;
          st[GI] = gi;
          normalise(st);
          k = st[K]! | 0;
          wr = st[WR]!;
          wi = st[WI]!;
          gr = st[GR]!;
          gi = st[GI]!;
          if (k !== 0) {
            s = k < -1000 ? 0 : ldexp(1, k);
            sdr = ldexp(dlr, unitExponent - k);
            sdi = ldexp(dli, unitExponent - k);
            hs = ldexp(1, unitExponent - k);
            lim = ldexp(1, k + 66);
          }
        }
      } else if (nz < 1e-300 && nz !== 0 && unitExponent < -400) {
        // |z| < 2^-498 without a rebase (the reference passes near 0): rescale
        st[K] = 0;
        st[WR] = wr;
        st[WI] = wi;
        st[GR] = gr;
        st[GI] = gi;
        normalise(st);
        k = st[K]! | 0;
        wr = st[WR]!;
        wi = st[WI]!;
        gr = st[GR]!;
        gi = st[GI]!;
        if (k !== 0) {
          s = k < -1000 ? 0 : ldexp(1, k);
          sdr = ldexp(dlr, unitExponent - k);
          sdi = ldexp(dli, unitExponent - k);
          hs = ldexp(1, unitExponent - k);
          lim = ldexp(1, k + 66);
        }
      }
      if (track && (minK !== 0 ? false : nf < MIN_DROP * minN)) {
        minN = nf;
        minK = 0;
        event = EV_NEWMIN;
        break;
      }
    } else {
      // ---------------------------------------------------------------- rescaled mode (B6b)
      if (!skipped) {
        const zr = re[m]!,
          zi = im[m]!;
        let tiny = -1;
        if (o.tinySlot !== null) tiny = o.tinySlot[m]!;
        if (tiny >= 0 || (zr === 0 && zi === 0)) {
          // Z is as small as z (m = 0 after a rebase, or a tiny reference
          // iterate): work in units of 2^k, z' = 2^k w (2 Zs + w) + c
          let zsr = 0,
            zsi = 0;
          if (tiny >= 0) {
            zsr = ldexp(o.tinyRe[tiny]!, o.tinyExp[tiny]! - k);
            zsi = ldexp(o.tinyIm[tiny]!, o.tinyExp[tiny]! - k);
          }
          const tr = 2 * zsr + wr,
            ti = 2 * zsi + wi; // 2 Zs + w
          const ur = 2 * (zsr + wr),
            ui = 2 * (zsi + wi); // 2 (Z + z) / 2^k
          // G <- 2 (Z + z) G + u; the factor may underflow only where the term is negligible
          const fcr = ldexp(ur, k),
            fci = ldexp(ui, k);
          const ngr = fcr * gr - fci * gi + hs;
          gi = fcr * gi + fci * gr;
          gr = ngr;
          const npr = ur * pr - ui * pi;
          pi = ur * pi + ui * pr;
          pr = npr;
          pe += k;
          const qr = wr * tr - wi * ti,
            qi = wr * ti + wi * tr;
          wr = ldexp(qr, k) + sdr;
          wi = ldexp(qi, k) + sdi;
        } else {
          // |Z| >= 2^-500 >> |z|: s = 2^k is flushed to 0 below 2^-1000, where
          // s w is below 2^-436 |Z| (and subnormal products would be slow)
          const fcr = 2 * (zr + s * wr),
            fci = 2 * (zi + s * wi);
          const ngr = fcr * gr - fci * gi + hs;
          gi = fcr * gi + fci * gr;
          gr = ngr;
          const npr = fcr * pr - fci * pi;
          pi = fcr * pi + fci * pr;
          pr = npr;
          const nwr = 2 * (zr * wr - zi * wi) + s * (wr * wr - wi * wi) + sdr;
          wi = 2 * (zr * wi + zi * wr) + s * (2 * wr * wi) + sdi;
          wr = nwr;
        }
        n += 1;
        m += 1;
        stepped += 1;
      }
      const ap = Math.abs(pr) + Math.abs(pi);
      if (ap > P_HIGH || (ap < P_LOW && ap !== 0)) {
        const e = exponentOf(ap);
        pr = ldexp(pr, -e);
        pi = ldexp(pi, -e);
        pe += e;
      }
      // full value and rebasing: only possible when |Z_m| < 2^(k+66)
      const nzr = re[m]!,
        nzi = im[m]!;
      const az = Math.abs(nzr) + Math.abs(nzi);
      let rebased = false;
      let tiny2 = -1;
      if (o.tinySlot !== null) tiny2 = o.tinySlot[m]!;
      if (tiny2 >= 0 || az < lim) {
        let xr: number, xi: number;
        if (tiny2 >= 0) {
          xr = ldexp(o.tinyRe[tiny2]!, o.tinyExp[tiny2]! - k);
          xi = ldexp(o.tinyIm[tiny2]!, o.tinyExp[tiny2]! - k);
        } else {
          xr = ldexp(nzr, -k);
          xi = ldexp(nzi, -k);
        }
        fr = xr + wr;
        fi = xi + wi;
        fk = k;
        const nf = fr * fr + fi * fi;
        if (nf < wr * wr + wi * wi || m === M) {
          wr = fr;
          wi = fi;
          m = 0;
          rebased = true;
          stats.rebases += 1;
        }
        if (track && lessNorm(nf, k, MIN_DROP * minN, minK)) {
          minN = nf;
          minK = k;
          event = EV_NEWMIN;
        }
      } else {
        fr = nzr;
        fi = nzi;
        fk = 0;
        if (m === M) {
          // exhausted on an escaped reference: the full value is Z_M
          wr = nzr + ldexp(wr, k);
          wi = nzi + ldexp(wi, k);
          gr = ldexp(gr, k);
          gi = ldexp(gi, k);
          k = 0;
          m = 0;
          rebased = true;
          stats.rebases += 1;
          fr = wr;
          fi = wi;
          if (fr * fr + fi * fi > escapeRadius2) {
            event = EV_ESCAPED;
            break;
          }
        }
        const nf = nzr * nzr + nzi * nzi;
        if (track && minK === 0 && nf < MIN_DROP * minN) {
          minN = nf;
          event = EV_NEWMIN;
        }
      }
      const aw = Math.abs(wr) + Math.abs(wi);
      if (k !== 0 && (aw > W_HIGH || (aw < W_LOW && aw !== 0) || rebased)) {
        st[K] = k;
        st[WR] = wr;
        st[WI] = wi;
        st[GR] = gr;
        st[GI] = gi;
        normalise(st);
        k = st[K]! | 0;
        wr = st[WR]!;
        wi = st[WI]!;
        gr = st[GR]!;
        gi = st[GI]!;
        if (k !== 0) {
          s = k < -1000 ? 0 : ldexp(1, k);
          sdr = ldexp(dlr, unitExponent - k);
          sdi = ldexp(dli, unitExponent - k);
          hs = ldexp(1, unitExponent - k);
          lim = ldexp(1, k + 66);
        } else {
          fr = re[m]! + wr;
          fi = im[m]! + wi;
          fk = 0;
        }
      }
      if (event === EV_NEWMIN) break;
    }
    if (n >= pauseAt) break;
  }
  stats.stepped += stepped;
  st[N] = n;
  st[M_] = m;
  st[K] = k;
  st[WR] = wr;
  st[WI] = wi;
  st[GR] = gr;
  st[GI] = gi;
  st[PR] = pr;
  st[PI] = pi;
  st[PE] = pe;
  st[FR] = fr;
  st[FI] = fi;
  st[FK] = fk;
  st[MINN] = minN;
  st[MINK] = minK;
  return event;
}
