import { describe, expect, it } from 'vitest';
import { protectNegativeNumbers } from '../../src/cli/main.js';

describe('protectNegativeNumbers', () => {
  it('moves describe positionals behind "--" in order, keeping options and their values in front', () => {
    expect(protectNegativeNumbers(['describe', '-1.76', '0', '--json'])).toEqual(['describe', '--json', '--', '-1.76', '0']);
    expect(protectNegativeNumbers(['describe', '-0.12,0.75', '--digits', '30'])).toEqual(['describe', '--digits', '30', '--', '-0.12,0.75']);
  });

  it('leaves other commands, positive arguments and an explicit "--" alone', () => {
    expect(protectNegativeNumbers(['plate', '--center', '-0.75,0'])).toEqual(['plate', '--center', '-0.75,0']);
    expect(protectNegativeNumbers(['describe', '0.25,0'])).toEqual(['describe', '0.25,0']);
    expect(protectNegativeNumbers(['describe', '--', '-1,0'])).toEqual(['describe', '--', '-1,0']);
  });
});
