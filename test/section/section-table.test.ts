import { describe, expect, it } from 'vitest';
import { formatTable, integerCell, numberCell, type SectionTable } from '../../src/section/section-table.js';

const table: SectionTable = {
  title: 'demo',
  columns: ['n', 'word'],
  rows: [
    ['1', 'R,L'],
    ['2', ''],
  ],
  summary: [{ name: 'delta', value: '4.669', note: '4 digits' }],
};

describe('formatTable', () => {
  it('formatTable csv quotes fields holding commas (RFC 4180)', () => {
    expect(formatTable(table, 'csv')).toBe('n,word\n1,"R,L"\n2,\n');
  });

  it('formatTable json keeps decimal strings as strings and empty cells as null', () => {
    const j = JSON.parse(formatTable(table, 'json')) as { rows: Record<string, unknown>[]; summary: Record<string, unknown> };
    expect(j.rows).toEqual([
      { n: '1', word: 'R,L' },
      { n: '2', word: null },
    ]);
    expect(j.summary['delta']).toEqual({ value: '4.669', note: '4 digits' });
  });

  it('formatTable text aligns columns and lists the summary', () => {
    const t = formatTable(table, 'text').split('\n');
    expect(t[1]).toBe('n  word');
    expect(t.some((l) => l.startsWith('delta  4.669  (4 digits)'))).toBe(true);
  });

  it('formatTable json writes double quantities as numbers and camelCase keys; text and csv show the stated digits', () => {
    const t: SectionTable = {
      title: 'typed',
      columns: ['period', 'onset_r', 'size'],
      rows: [[integerCell(3), '3.8284271247461900976', numberCell(0.019035515913132, '1.90355e-2')]],
      summary: [
        { name: 'windows per period', value: '1 1 1' },
        { name: 'r_inf', value: '3.5699' },
      ],
    };
    const j = JSON.parse(formatTable(t, 'json')) as { rows: Record<string, unknown>[]; summary: Record<string, unknown> };
    expect(j.rows[0]).toEqual({ period: 3, onsetR: '3.8284271247461900976', size: 0.019035515913132 });
    expect(j.summary).toEqual({ windowsPerPeriod: '1 1 1', rInf: '3.5699' });
    expect(formatTable(t, 'csv')).toBe('period,onset_r,size\n3,3.8284271247461900976,1.90355e-2\n');
    expect(formatTable(t, 'text').split('\n')[3]).toBe('3       3.8284271247461900976  1.90355e-2');
  });
});
