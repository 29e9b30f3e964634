/**
 * The hyperbolic component of the c-plane that holds a real superstable
 * parameter: its nucleus (the parameter itself, on the real axis) and the
 * Hunt-Ott size estimate s = 1 / (beta lambda^2), with lambda = prod 2 z_k,
 * beta = sum 1 / lambda_k over k = 1..p-1 (B. Hunt, E. Ott, J. Phys. A 30
 * (1997) 7067-7076; methods.md C4). |s| is the scale of the component and a
 * real window's whole width is about 9/4 |s|; shape by Dolotin-Morozov
 * (methods.md C4): a primitive window's component is a cardioid, a doubled
 * one a disk.
 */
export interface RealComponent {
  /** The nucleus c as a decimal string. */
  nucleus: string;
  /** |s|. */
  size: number;
  /** arg s: 0 or pi on the real axis. */
  orientation: number;
  shape: 'cardioid' | 'disk';
}

/**
 * Size estimate in double precision at a real nucleus c of period p (the
 * components code's sizeEstimate does the same in the plane; this real
 * version serves the section tables).
 */
export function componentOf(period: number, nucleus: string): RealComponent {
  const c = Number(nucleus);
  let z = 0;
  let lambda = 1;
  let beta = 1;
  for (let k = 1; k < period; k++) {
    z = z * z + c;
    lambda *= 2 * z;
    beta += 1 / lambda;
  }
  const s = period === 1 ? 1 : 1 / (beta * lambda * lambda);
  // Shape estimate (Dolotin & Morozov 2008, eq. 5.8): derivatives at the nucleus.
  let zz = c;
  let dc = 1;
  let dz = 1;
  let dcc = 0;
  let dcz = 0;
  for (let k = 1; k < period; k++) {
    dcc = 2 * (zz * dcc + dc * dc);
    dcz = 2 * (zz * dcz + dc * dz);
    dc = 2 * zz * dc + 1;
    dz = 2 * zz * dz;
    zz = zz * zz + c;
  }
  const shapeValue = period === 1 ? 0 : -(dcc / (2 * dc) + dcz / dz) / (dc * dz);
  return {
    nucleus,
    size: Math.abs(s),
    orientation: s < 0 ? Math.PI : 0,
    shape: Math.abs(shapeValue) < Math.abs(shapeValue - 1) ? 'cardioid' : 'disk',
  };
}
