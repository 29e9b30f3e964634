/**
 * Shared parsing and printing for `components`, `locate` and `probe`:
 * integer flags, boxes, and one component as key-value lines or JSON.
 */
import { UserError } from '../check/user-error.js';
import type { ComponentInfo } from '../components/component-info.js';
import { componentJson, componentLines, significant, sizeText } from '../components/component-json.js';
import { angleText } from '../components/external-angle.js';
import { addressText } from '../components/internal-address.js';

export { componentJson, componentLines, significant, sizeText };

/** Parses "RE0,IM0,RE1,IM1" into a box with re0 < re1, im0 < im1. */
export function parseBox(value: unknown, field: string): { re0: number; im0: number; re1: number; im1: number } {
  const parts = typeof value === 'string' ? value.split(',').map((s) => s.trim()) : [];
  const nums = parts.map((s) => (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s) ? Number(s) : Number.NaN));
  if (nums.length !== 4 || nums.some((n) => !Number.isFinite(n))) {
    throw new UserError(field, 'four decimal numbers RE0,IM0,RE1,IM1', value);
  }
  const [re0, im0, re1, im1] = nums as [number, number, number, number];
  if (!(re0 < re1 && im0 < im1)) throw new UserError(field, 'a box RE0,IM0,RE1,IM1 with RE0 < RE1 and IM0 < IM1', value);
  return { re0, im0, re1, im1 };
}
