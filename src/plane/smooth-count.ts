/**
 * Smooth (continuous) escape count (docs/methods.md A1; L. Vepstas, "Renormalizing
 * the Mandelbrot escape" (1997)): mu = n - log2(ln|z_n| / ln R) for the first
 * n with |z_n| > R. It lies in (n - 1, n] up to |c|/R^2 and is continuous
 * across bands because ln|z_{n+1}| ~ 2 ln|z_n| once |z| is large; a larger R
 * leaves smaller seams. `logEscapeRadius` is ln R.
 */
export function smoothCount(iterations: number, zRe: number, zIm: number, logEscapeRadius: number): number {
  return smoothCountFromLog(iterations, Math.log(zRe * zRe + zIm * zIm), logEscapeRadius);
}

/**
 * smoothCount given logModulus2 = ln(|z_n|^2) = ln(zRe * zRe + zIm * zIm), for
 * callers that also need that logarithm (the exterior distance does): the
 * same operations, so the same double.
 */
export function smoothCountFromLog(iterations: number, logModulus2: number, logEscapeRadius: number): number {
  // ln|z| = ln(|z|^2) / 2
  return iterations - Math.log2((0.5 * logModulus2) / logEscapeRadius);
}
