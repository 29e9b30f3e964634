import { describe, expect, it } from 'vitest';
import { protectNegativeNumbers } from '../../src/cli/main.js';

describe('protectNegativeNumbers', () => {
  it('moves probe positionals behind "--" in order, keeping options and their values in front', () => {
    expect(protectNegativeNumbers(['probe', '-1.76', '0', '--json'])).toEqual(['probe', '--json', '--', '-1.76', '0']);
    expect(protectNegativeNumbers(['probe', '-0.12,0.75', '--digits', '30'])).toEqual(['probe', '--digits', '30', '--', '-0.12,0.75']);
  });

  it('leaves other commands, positive arguments and an explicit "--" alone', () => {
    expect(protectNegativeNumbers(['plate', '--center', '-0.75,0'])).toEqual(['plate', '--center', '-0.75,0']);
    expect(protectNegativeNumbers(['probe', '0.25,0'])).toEqual(['probe', '0.25,0']);
    expect(protectNegativeNumbers(['probe', '--', '-1,0'])).toEqual(['probe', '--', '-1,0']);
  });
});
