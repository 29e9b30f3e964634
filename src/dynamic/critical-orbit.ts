/** The first n points z_0 = 0, z_1 = c, ... of the critical orbit of z^2 + c, as (re, im) pairs; stops early past |z| = bailout. */
export function criticalOrbit(cRe: number, cIm: number, n: number, bailout = 1e3): number[] {
  const out: number[] = [];
  let x = 0,
    y = 0;
  for (let k = 0; k < n; k++) {
    out.push(x, y);
    if (!(x * x + y * y <= bailout * bailout)) break;
    const u = x * x - y * y + cRe;
    y = 2 * x * y + cIm;
    x = u;
  }
  return out;
}
