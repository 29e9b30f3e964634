/**
 * `quadatlas palettes [--out-dir DIR] [--gradient FILE] [--json]`: names and
 * shows every exterior gradient, interior style and the period palette. On a
 * colour terminal each gradient and the period colours are also drawn as
 * blocks; `--out-dir` writes a swatch PNG of each (src/colour/swatches.ts).
 */
import { readFileSync } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import path from 'node:path';
import type { Command } from 'commander';
import { PNG } from 'pngjs';
import { DEFAULT_COLOUR_SETTINGS, INTERIOR_STYLE_NOTES, INTERIOR_STYLES } from '../colour/colour-settings.js';
import { EXTERIOR_GRADIENT_NAMES, EXTERIOR_GRADIENT_NOTES, EXTERIOR_GRADIENTS, gradientLinear } from '../colour/exterior-gradients.js';
import { customGradientLinear, gradientStopsFromText, prepareGradient, type GradientStop } from '../colour/gradient-stops.js';
import { linearToHex, oklchToLinear } from '../colour/oklab.js';
import { PERIOD_GREYSCALE_DISTINCT, periodHex } from '../colour/period-palette.js';
import { gradientSwatch, interiorSwatch, periodSwatch, type Swatch } from '../colour/swatches.js';
import { checkWritableDirectory } from '../io/check-writable-directory.js';
import { writeFileAtomic } from '../io/write-file-atomic.js';
import { Received, UserError } from '../check/user-error.js';
import { addOptions, type OptionSpec } from './option-spec.js';

/** Periods listed and drawn in the period swatch. */
export const PALETTE_PERIODS = 24;

function png(s: Swatch): Buffer {
  const image = new PNG({ width: s.width, height: s.height, colorType: 6, inputColorType: 6 });
  image.data = Buffer.from(s.rgba);
  return PNG.sync.write(image, { colorType: 6, inputColorType: 6 });
}

/** The stops of a named gradient as sRGB hex (its OKLCh stops, evenly spaced around the cycle). */
function namedStops(name: keyof typeof EXTERIOR_GRADIENTS): GradientStop[] {
  const stops = EXTERIOR_GRADIENTS[name];
  return stops.map(([L, C, h], i) => {
    const c = oklchToLinear(L, C, h, [0, 0, 0]);
    return { at: i / stops.length, colour: linearToHex(c[0]!, c[1]!, c[2]!) };
  });
}

/** A row of n truecolour blocks, for a terminal that shows colour. */
function blocks(colourAt: (i: number) => string, n: number): string {
  let s = '';
  for (let i = 0; i < n; i++) {
    const hex = colourAt(i);
    const [r, g, b] = [1, 3, 5].map((k) => parseInt(hex.slice(k, k + 2), 16));
    s += `\x1b[48;2;${r};${g};${b}m  `;
  }
  return `${s}\x1b[0m`;
}

function gradientHexAt(gradient: keyof typeof EXTERIOR_GRADIENTS | readonly GradientStop[], t: number): string {
  const c = [0, 0, 0];
  if (typeof gradient === 'string') gradientLinear(gradient, t, c);
  else customGradientLinear(prepareGradient(gradient), t, c);
  return linearToHex(c[0]!, c[1]!, c[2]!);
}

export const PALETTES_OPTIONS: readonly OptionSpec[] = [
  { flags: '--out-dir <dir>', description: 'write a swatch PNG per gradient, per interior style and one of the period colours into DIR (default: none)' },
  { flags: '--gradient <file>', description: 'also show a custom gradient from colour stops (JSON or CSV at,colour, as plate --gradient reads; default: none)' },
  { flags: '--json', description: 'print the listing as JSON on stdout (default: text)' },
];

export function register(program: Command): void {
  addOptions(program.command('palettes').description('list and show the exterior gradients, interior styles and period colours'), PALETTES_OPTIONS).action(
    async (values: { outDir?: string; gradient?: string; json?: boolean }) => {
      let custom: GradientStop[] | null = null;
      if (values.gradient !== undefined) {
        let text: string;
        try {
          text = readFileSync(values.gradient, 'utf8');
        } catch (err) {
          throw new UserError(
            '--gradient',
            'a readable file of colour stops (JSON or CSV)',
            new Received(`${values.gradient} (${(err as NodeJS.ErrnoException).code ?? 'unreadable'})`),
          );
        }
        custom = gradientStopsFromText(text, values.gradient, '--gradient');
      }
      const listing = {
        exterior: EXTERIOR_GRADIENT_NAMES.map((name) => ({
          name,
          default: name === DEFAULT_COLOUR_SETTINGS.exterior,
          note: EXTERIOR_GRADIENT_NOTES[name],
          stops: namedStops(name),
        })),
        ...(custom === null ? {} : { gradient: custom }),
        interior: INTERIOR_STYLES.map((name) => ({ name, default: name === DEFAULT_COLOUR_SETTINGS.interior, note: INTERIOR_STYLE_NOTES[name] })),
        periods: Array.from({ length: PALETTE_PERIODS }, (_, i) => ({ period: i + 1, colour: periodHex(i + 1) })),
      };
      const written: string[] = [];
      if (values.outDir !== undefined) {
        const dir = values.outDir;
        try {
          await mkdir(dir, { recursive: true });
        } catch (err) {
          throw new UserError('--out-dir', 'a directory that exists or can be created', new Received(`${dir} (${(err as NodeJS.ErrnoException).code ?? 'error'})`));
        }
        await checkWritableDirectory(dir, '--out-dir');
        const out: Array<[string, Swatch]> = [
          ...EXTERIOR_GRADIENT_NAMES.map((n) => [`gradient-${n}.png`, gradientSwatch(n)] as [string, Swatch]),
          ...(custom === null ? [] : [['gradient-custom.png', gradientSwatch(custom)] as [string, Swatch]]),
          ...INTERIOR_STYLES.map((s) => [`interior-${s}.png`, interiorSwatch(s)] as [string, Swatch]),
          ['period-palette.png', periodSwatch((await import('../figure/figure-font.js')).figureFont(), PALETTE_PERIODS)],
        ];
        for (const [name, swatch] of out) {
          const file = path.join(dir, name);
          await writeFileAtomic(file, png(swatch));
          written.push(file);
        }
      }
      if (values.json === true) {
        process.stdout.write(`${JSON.stringify({ ...listing, files: written.map((f) => path.resolve(f)) }, null, 2)}\n`);
      } else {
        const colour = process.stdout.isTTY === true && process.env['NO_COLOR'] === undefined;
        const lines: string[] = ['exterior gradients (--exterior NAME, colour.exterior; one cycle left to right):'];
        for (const g of listing.exterior) {
          lines.push(`  ${g.name.padEnd(10)} ${g.note}${g.default ? ' (default)' : ''}`);
          lines.push(`  ${''.padEnd(10)} stops ${g.stops.map((s) => s.colour).join(' ')}`);
          if (colour) lines.push(`  ${''.padEnd(10)} ${blocks((i) => gradientHexAt(g.name, (i + 0.5) / 32), 32)}`);
        }
        if (custom !== null) {
          lines.push(`  ${'custom'.padEnd(10)} ${values.gradient} (--gradient FILE, colour.gradient): ${custom.map((s) => `${s.at} ${s.colour}`).join(', ')}`);
          if (colour) lines.push(`  ${''.padEnd(10)} ${blocks((i) => gradientHexAt(custom, (i + 0.5) / 32), 32)}`);
        }
        lines.push('interior styles (--interior STYLE, colour.interior):');
        for (const s of listing.interior) lines.push(`  ${s.name.padEnd(19)} ${s.note}${s.default ? ' (default)' : ''}`);
        lines.push(
          `period colours 1..${PALETTE_PERIODS} (cycling every 64; 1..12 stay apart for protanopia, deuteranopia and tritanopia, 1..${PERIOD_GREYSCALE_DISTINCT} in greyscale):`,
        );
        for (let row = 0; row < PALETTE_PERIODS; row += 8) {
          lines.push(
            `  ${listing.periods
              .slice(row, row + 8)
              .map((p) => `${String(p.period).padStart(2)} ${p.colour}`)
              .join('  ')}`,
          );
        }
        if (colour) lines.push(`  ${blocks((i) => periodHex(i + 1), PALETTE_PERIODS)}`);
        process.stdout.write(`${lines.join('\n')}\n`);
        if (written.length > 0) process.stderr.write(`wrote ${written.join(', ')}\n`);
      }
    },
  );
}
