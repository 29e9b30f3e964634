import { describe, expect, it } from 'vitest';
import { axisParameter, diagramColumns, type DiagramSettings } from '../../src/section/density-diagram.js';
import { logistic } from '../../src/section/families/index.js';
import { renderDiagram } from '../../src/section/render-diagram.js';

const settings: DiagramSettings = { width: 40, height: 50, samples: 3, transient: 300, iterations: 400, stateTop: 1, stateBottom: 0 };
const axis = { kind: 'parameter', from: 2.8, to: 4 } as const;

describe('diagramColumns', () => {
  it('diagramColumns gives the same bytes whatever the split of the columns', () => {
    const whole = diagramColumns(logistic, axis, settings, 0, 40, new Uint16Array(40 * 50), new Float64Array(50));
    const parts = new Uint16Array(40 * 50);
    for (const [a, b] of [
      [0, 7],
      [7, 8],
      [8, 40],
    ] as const)
      parts.set(diagramColumns(logistic, axis, settings, a, b, new Uint16Array((b - a) * 50), new Float64Array(50)), a * 50);
    expect(parts).toEqual(whole);
  });

  it('diagramColumns inks the fixed point 1 - 1/r in the two rows around it (tent splat)', () => {
    // At r = 2.8 the orbit settles on x* = 1 - 1/r (exact): all ink lies in the rows next to x*.
    const at = { kind: 'parameter', from: 2.8, to: 2.8 } as const;
    const one = { ...settings, width: 1 };
    const col = diagramColumns(logistic, at, one, 0, 1, new Uint16Array(50), new Float64Array(50));
    const y = (1 - (1 - 1 / 2.8)) * 50 - 0.5;
    const inked = [...col.keys()].filter((j) => col[j]! < 65535);
    expect(inked.every((j) => Math.abs(j - y) < 1)).toBe(true);
    expect(inked.length).toBeGreaterThanOrEqual(1);
    expect(inked.length).toBeLessThanOrEqual(2);
  });

  it('axisParameter on a c axis returns r = 1 + sqrt(1 - 4c)', () => {
    // Conjugacy, docs/methods.md E1 (exact): c = -2 -> r = 4, c = -3/4 -> r = 3.
    expect(axisParameter({ kind: 'c', from: -2, to: -0.75 }, 0)).toBe(4);
    expect(axisParameter({ kind: 'c', from: -2, to: -0.75 }, 1)).toBe(3);
  });
});

describe('renderDiagram', () => {
  it('renderDiagram in one thread equals diagramColumns column by column, transposed', async () => {
    const img = await renderDiagram(logistic, axis, settings, 1);
    const cols = diagramColumns(logistic, axis, settings, 0, 40, new Uint16Array(40 * 50), new Float64Array(50));
    for (let i = 0; i < 40; i += 13) for (let j = 0; j < 50; j += 7) expect(img[j * 40 + i]).toBe(cols[i * 50 + j]);
  });
});
