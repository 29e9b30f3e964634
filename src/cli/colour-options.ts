/**
 * The colouring flags of `quadatlas plate`: one flag per field of the sheet's
 * `colour` block (src/colour/colour-settings.ts), in kebab case, declared once
 * in the same table shape as PLATE_OPTIONS (plate-options.ts), which splices
 * this table in.
 *
 * Each flag checks its value at once with the sheet's own field check, so an
 * error names both the flag and the field it sets, e.g.
 * "Expected a number in [0, 1000] for --edge (colour.edge) but received -1".
 */
import { readFileSync } from 'node:fs';
import { DEFAULT_COLOUR_SETTINGS, INTERIOR_STYLES, LEGEND_CORNERS, LEGEND_PLACEMENTS, parseColourField, type ColourKey } from '../colour/colour-settings.js';
import { EXTERIOR_GRADIENT_NAMES } from '../colour/exterior-gradients.js';
import { gradientStopsFromText } from '../colour/gradient-stops.js';
import { LEGEND_MIN_PIXELS } from '../colour/legend.js';
import type { OptionSpec } from './option-spec.js';
import { Received, UserError } from '../check/user-error.js';

const d = DEFAULT_COLOUR_SETTINGS;

/** Marks a colour block whose exterior was set by --exterior on this command line (a hidden symbol key, never in JSON). */
const EXTERIOR_FLAG = Symbol('exterior flag');

function colourBlock(sheet: Record<string, unknown>): Record<string | symbol, unknown> {
  const v = sheet['colour'];
  if (typeof v === 'object' && v !== null && !Array.isArray(v)) return v as Record<string | symbol, unknown>;
  const fresh: Record<string, unknown> = {};
  sheet['colour'] = fresh;
  return fresh;
}

/** A number when the text is one, else the text itself (so the field check shows what was typed). */
function numeric(value: string): number | string {
  const n = Number(value);
  return value.trim() !== '' && Number.isFinite(n) ? n : value;
}

/** An option row that sets one colour field, checked under "--flag (colour.key)". */
function field(flag: string, key: ColourKey, placeholder: string, description: string, convert: (v: string) => unknown = (v) => v.trim()): OptionSpec {
  return {
    flags: `${flag} <${placeholder}>`,
    description,
    apply: (sheet, value) => {
      colourBlock(sheet)[key] = parseColourField(key, convert(value), `${flag} (colour.${key})`);
    },
  };
}

const list = (xs: readonly string[]): string => xs.join(', ');

export const COLOUR_OPTIONS: readonly OptionSpec[] = [
  {
    flags: '--exterior <name>',
    description: `exterior gradient: ${list(EXTERIOR_GRADIENT_NAMES)} (default ${d.exterior}; see \`quadatlas palettes\`)`,
    apply: (sheet, value) => {
      const c = colourBlock(sheet);
      c['exterior'] = parseColourField('exterior', value.trim(), '--exterior (colour.exterior)');
      delete c['gradient'];
      Object.defineProperty(c, EXTERIOR_FLAG, { value: true, enumerable: false, configurable: true });
    },
  },
  {
    flags: '--gradient <file>',
    description:
      'custom exterior gradient from colour stops: a JSON array of {"at", "colour"} or CSV lines at,colour (at in [0, 1] of a cycle, colour sRGB #rrggbb); the stops are copied into the sheet as colour.gradient (default: none, the named --exterior)',
    apply: (sheet, value) => {
      const c = colourBlock(sheet);
      if (c[EXTERIOR_FLAG] === true) throw new UserError('--gradient', 'either --exterior or --gradient, not both', value);
      let text: string;
      try {
        text = readFileSync(value, 'utf8');
      } catch (err) {
        throw new UserError(
          '--gradient (colour.gradient)',
          'a readable file of colour stops (JSON or CSV)',
          new Received(`${value} (${(err as NodeJS.ErrnoException).code ?? 'unreadable'})`),
        );
      }
      c['gradient'] = gradientStopsFromText(text, value, '--gradient');
    },
  },
  field('--count-scale', 'countScale', 'scale', `how the smooth count mu feeds the gradient: log (u = ln(1 + mu)) or linear (u = mu) (default ${d.countScale})`),
  field('--gradient-cycle', 'cycle', 'u', `length of one pass through the gradient, in units of u (> 0, default ${d.cycle})`, numeric),
  field('--offset', 'offset', 'fraction', `shift of the gradient, as a fraction of a cycle in [0, 1) (default ${d.offset})`, numeric),
  field('--edge', 'edge', 'pixels', `exterior edge width in pixels, from the distance estimate (0 turns it off; default ${d.edge})`, numeric),
  field('--edge-colour', 'edgeColour', 'hex', `ink the edges fade to, sRGB #rrggbb (default ${d.edgeColour})`),
  field('--interior', 'interior', 'style', `interior style: ${list(INTERIOR_STYLES)} (default ${d.interior}; see \`quadatlas palettes\`)`),
  field('--interior-colour', 'interiorColour', 'hex', `interior colour for --interior solid, sRGB #rrggbb (default ${d.interiorColour})`),
  field('--interior-edge', 'interiorEdge', 'pixels', `interior edge width in pixels, from the interior distance estimate (0 turns it off; default ${d.interiorEdge})`, numeric),
  field('--undecided-colour', 'undecidedColour', 'hex', `colour of samples undecided at the iteration limit, sRGB #rrggbb (default ${d.undecidedColour})`),
  field('--legend', 'legend', 'where', `period legend: ${list(LEGEND_PLACEMENTS)} (inset: on the plate; beside: an SVG file next to it; default ${d.legend})`),
  field('--legend-corner', 'legendCorner', 'corner', `corner of an inset legend: ${list(LEGEND_CORNERS)} (default ${d.legendCorner})`),
  field(
    '--legend-periods',
    'legendPeriods',
    'n',
    `most periods the legend lists, 1..64 (default ${d.legendPeriods}); it lists the periods present in the view, those with at least ${LEGEND_MIN_PIXELS} interior pixels, keeping the n with the most pixels`,
    numeric,
  ),
];
