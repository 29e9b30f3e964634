/**
 * The hyperbolic component of the c-plane that holds a real superstable
 * parameter: its nucleus (the parameter itself, on the real axis) and the
 * Hunt-Ott size estimate with the Dolotin-Morozov shape, from the components
 * code (sizeEstimate, docs/methods.md C4; B. Hunt, E. Ott, J. Phys. A 30 (1997)
 * 7067-7076). A real window's whole width is about 9/4 of the size.
 */
import { sizeEstimate } from '../components/size-estimate.js';

export interface RealComponent {
  /** The nucleus c as a decimal string. */
  nucleus: string;
  /** |s|. */
  size: number;
  /** arg s: 0 or pi on the real axis. */
  orientation: number;
  shape: 'cardioid' | 'disk';
}

export function componentOf(period: number, nucleus: string): RealComponent {
  const s = sizeEstimate(period, { re: nucleus, im: '0' });
  return { nucleus, size: s.size, orientation: s.orientation, shape: s.shape };
}
