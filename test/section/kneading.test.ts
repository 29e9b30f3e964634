import { describe, expect, it } from 'vitest';
import { compactWord, compareItineraries, isAdmissibleWord, mssWords, satelliteParent } from '../../src/section/kneading.js';

// Real components of exact period n: OEIS A000048 (Metropolis, Stein & Stein 1973), docs/checks.md "Counts".
const A000048 = [1, 1, 1, 2, 3, 5, 9, 16, 28, 51, 93, 170];

describe('mssWords', () => {
  it('mssWords(p) counts OEIS A000048 for p = 1..12', () => {
    expect(A000048.map((_, i) => mssWords(i + 1).length)).toEqual(A000048);
  });

  it('mssWords orders periods 4 to 7 as in Metropolis-Stein-Stein 1973', () => {
    // docs/methods.md E5 (MSS 1973 table): period 4 RLR, RLL; 5 RLRR, RLLR, RLLL;
    // 6 RLRRR, RLLRL, RLLRR, RLLLR, RLLLL; 7 from RLRRRR to RLLLLL (9 words).
    expect(mssWords(4)).toEqual(['RLR', 'RLL']);
    expect(mssWords(5)).toEqual(['RLRR', 'RLLR', 'RLLL']);
    expect(mssWords(6)).toEqual(['RLRRR', 'RLLRL', 'RLLRR', 'RLLLR', 'RLLLL']);
    const w7 = mssWords(7);
    expect([w7[0], w7[8], w7.length]).toEqual(['RLRRRR', 'RLLLLL', 9]);
  });

  it('mssWords of periods 2..5 merged in parameter order match the docs/checks.md row', () => {
    // docs/checks.md (Metropolis-Stein-Stein 1973): R; RLR; RLR^2 (5); RL; RL^2R (5); RL^2 (4); RL^3 (5).
    const all = [2, 3, 4, 5].flatMap((p) => mssWords(p));
    all.sort((a, b) => compareItineraries(`${a}C`.padEnd(12, 'L'), `${b}C`.padEnd(12, 'L')));
    expect(all.map(compactWord)).toEqual(['R', 'RLR', 'RLR^2', 'RL', 'RL^2R', 'RL^2', 'RL^3']);
  });
});

describe('isAdmissibleWord', () => {
  it('isAdmissibleWord rejects words with a larger shift (LR, RR of period 3)', () => {
    expect(isAdmissibleWord('RL')).toBe(true);
    expect(isAdmissibleWord('RR')).toBe(false);
    expect(isAdmissibleWord('LR')).toBe(false);
  });
});

describe('satelliteParent', () => {
  it('satelliteParent finds the period-doubled words R, RLR, RLRRRLR and RLLRL', () => {
    // Harmonics (MSS 1973): R = doubling of the fixed point, RLR of R, RLRRRLR of RLR, RLLRL of RL.
    expect(satelliteParent('R')).toBe('');
    expect(satelliteParent('RLR')).toBe('R');
    expect(satelliteParent('RLRRRLR')).toBe('RLR');
    expect(satelliteParent('RLLRL')).toBe('RL');
    expect(satelliteParent('RLL')).toBeUndefined();
    expect(satelliteParent('RLLRR')).toBeUndefined();
  });
});
