/**
 * The PNG plots of the real slice (`section lyapunov`, `section entropy`,
 * `section compare`) never hand <text> to the rasteriser: librsvg would set
 * it in the machine's fonts, so the bytes would depend on the machine. sharp
 * is wrapped here to record every SVG it is given; each must hold no <text>
 * element and carry its labels' strings as aria-labels of outlines.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { tempDir } from '../helpers/run-cli.js';
import { outlines } from '../helpers/outline-boxes.js';

const seen = vi.hoisted(() => [] as string[]);

vi.mock('sharp', async (importOriginal) => {
  const real = ((await importOriginal()) as { default: (input?: unknown, options?: unknown) => unknown }).default;
  const wrapped = (input?: unknown, options?: unknown): unknown => {
    if (Buffer.isBuffer(input) && input.subarray(0, 4).toString() === '<svg') seen.push(input.toString('utf8'));
    return real(input, options);
  };
  return { default: wrapped };
});

const { main } = await import('../../src/cli/main.js');
const { rasterisePlot } = await import('../../src/cli/section/section-output.js');

async function svgHandedOver(argv: string[]): Promise<string> {
  seen.length = 0;
  const stdout = vi.spyOn(process.stdout, 'write').mockImplementation(() => true);
  const stderr = vi.spyOn(process.stderr, 'write').mockImplementation(() => true);
  try {
    expect(await main(argv)).toBe(0);
  } finally {
    stdout.mockRestore();
    stderr.mockRestore();
  }
  expect(seen).toHaveLength(1);
  return seen[0]!;
}

describe('section PNG plots', () => {
  const cases: Array<[string, string[], string[]]> = [
    ['lyapunov', ['section', 'lyapunov', '--family', 'sine', '--steps', '60', '--iterations', '500'], ['Lyapunov exponent', '0.8', '0.9']],
    ['entropy', ['section', 'entropy', '--steps', '40', '--letters', '64'], ['entropy h', 'r', '3', '4']],
    ['compare', ['section', 'compare', '--size', '400x300', '--samples', '1', '--plane-iterations', '300', '--workers', '1'], ['Im c', 'x', '-1.5', '-1']],
  ];
  for (const [name, argv, strings] of cases) {
    it(`section ${name}: the SVG handed to sharp holds no <text>, and its labels are outlines with aria-labels`, async () => {
      const file = path.join(tempDir(), `${name}.png`);
      const svg = await svgHandedOver([...argv, '--out', file]);
      expect(svg).not.toMatch(/<text[\s>]/);
      const labels = outlines(svg).map((o) => o.label);
      for (const s of strings) expect(labels, s).toContain(s);
      // the PNG was written (signature 89 50 4E 47, the PNG specification)
      expect(readFileSync(file).subarray(0, 4).toString('hex')).toBe('89504e47');
    }, 60_000);
  }

  it('rasterisePlot refuses an SVG with a <text> element', async () => {
    await expect(rasterisePlot('<svg xmlns="http://www.w3.org/2000/svg"><text x="1" y="1">a</text></svg>')).rejects.toThrow(/<text>/);
  });
});
