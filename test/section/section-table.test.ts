import { describe, expect, it } from 'vitest';
import { formatTable, type SectionTable } from '../../src/section/section-table.js';

const table: SectionTable = {
  title: 'demo',
  columns: ['n', 'word'],
  rows: [['1', 'R,L'], ['2', '']],
  summary: [{ name: 'delta', value: '4.669', note: '4 digits' }],
};

describe('formatTable', () => {
  it('formatTable csv quotes fields holding commas (RFC 4180)', () => {
    expect(formatTable(table, 'csv')).toBe('n,word\n1,"R,L"\n2,\n');
  });

  it('formatTable json keeps values as strings and empty cells as null', () => {
    const j = JSON.parse(formatTable(table, 'json')) as { rows: Record<string, unknown>[]; summary: Record<string, unknown> };
    expect(j.rows).toEqual([{ n: '1', word: 'R,L' }, { n: '2', word: null }]);
    expect(j.summary['delta']).toEqual({ value: '4.669', note: '4 digits' });
  });

  it('formatTable text aligns columns and lists the summary', () => {
    const t = formatTable(table, 'text').split('\n');
    expect(t[1]).toBe('n  word');
    expect(t.some((l) => l.startsWith('delta  4.669  (4 digits)'))).toBe(true);
  });
});
