import { describe, expect, it } from 'vitest';
import { sizeEstimate, sizeEstimateScaled } from '../../src/components/size-estimate.js';

describe('sizeEstimate', () => {
  it('the real period-3 component has |s| = 0.019035515913132 (docs/checks.md, Hunt & Ott 1997 formula) and is cardioid-like', () => {
    const s = sizeEstimate(3, { re: '-1.7548776662466927600', im: '0' });
    expect(s.size).toBeCloseTo(0.019035515913132, 14);
    expect(s.shape).toBe('cardioid');
  });
  it('period 1 gives 1 (cardioid), period 2 gives 0.5 (disk) (docs/methods.md C4 [checked])', () => {
    expect(sizeEstimate(1, { re: '0', im: '0' })).toEqual({ size: 1, orientation: 0, shape: 'cardioid' });
    const two = sizeEstimate(2, { re: '-1', im: '0' });
    expect([two.size, two.shape]).toEqual([0.5, 'disk']);
  });
  it('conjugate nuclei give the same size and opposite orientation (symmetry about the real axis)', () => {
    const a = sizeEstimate(3, { re: '-0.12256116687665361998', im: '0.74486176661974423659' });
    const b = sizeEstimate(3, { re: '-0.12256116687665361998', im: '-0.74486176661974423659' });
    expect(a.size).toBeCloseTo(b.size, 15);
    expect(a.orientation).toBeCloseTo(-b.orientation, 14);
  });
  it('sizeEstimateScaled(5, real nucleus near -2): log10Size equals log10(size)', () => {
    const s = sizeEstimateScaled(5, { re: '-1.985424253054205', im: '0' });
    expect(s.log10Size).toBeCloseTo(Math.log10(s.size), 10);
  });
});
