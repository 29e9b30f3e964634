import { UserError } from '../check/user-error.js';
import { EXTERIOR_GRADIENT_NAMES, type ExteriorGradientName } from './exterior-gradients.js';
import { parseGradientStops, type GradientStop } from './gradient-stops.js';
import { PERIOD_PALETTE_SIZE } from './period-palette.js';

/** How interior (attracting-cycle) samples are coloured. */
export type InteriorStyle = 'period' | 'period-depth' | 'period-angle' | 'period-depth-angle' | 'solid';
export const INTERIOR_STYLES: readonly InteriorStyle[] = ['period', 'period-depth', 'period-angle', 'period-depth-angle', 'solid'];

/** One line about each interior style (see ColourSettings.interior), for `quadatlas palettes`. */
export const INTERIOR_STYLE_NOTES: Readonly<Record<InteriorStyle, string>> = {
  period: 'the flat period-palette colour',
  'period-depth': 'the period colour, darker toward the centre of the cycle (0.4 + 0.6 |multiplier|)',
  'period-angle': 'the period colour stepped by the internal angle arg(multiplier) / 2 pi (0.7 + 0.3 angle)',
  'period-depth-angle': 'both factors',
  solid: 'every interior sample takes colour.interiorColour',
};

/** Where the period legend goes. */
export type LegendPlacement = 'none' | 'inset' | 'beside';
export const LEGEND_PLACEMENTS: readonly LegendPlacement[] = ['none', 'inset', 'beside'];

export type LegendCorner = 'top-left' | 'top-right' | 'bottom-left' | 'bottom-right';
export const LEGEND_CORNERS: readonly LegendCorner[] = ['top-left', 'top-right', 'bottom-left', 'bottom-right'];

/**
 * The `colour` block of a sheet: everything that turns per-sample results
 * (smooth count, distance, period, multiplier) into colour. Plain JSON, recorded
 * in a plate's metadata so the plate can be coloured again identically.
 */
export interface ColourSettings {
  /**
   * Exterior gradient name (exterior-gradients.ts): tidepool, heather, brass,
   * vellum. Ignored when `gradient` is present.
   */
  readonly exterior: ExteriorGradientName;
  /**
   * A custom exterior gradient: colour stops [{at, colour}] along one cycle
   * (gradient-stops.ts). Absent unless given; when present it replaces the
   * named `exterior` gradient. The stops themselves live in the sheet, never
   * a path, so a plate renders again from its metadata alone.
   */
  readonly gradient?: readonly GradientStop[];
  /**
   * How the smooth count mu is mapped before the gradient repeats:
   * `log` uses u = ln(1 + mu), `linear` uses u = mu.
   */
  readonly countScale: 'log' | 'linear';
  /** Length of one full pass through the gradient, in units of u (> 0). */
  readonly cycle: number;
  /** Shift of the gradient, as a fraction of a cycle, in [0, 1). */
  readonly offset: number;
  /**
   * Exterior edge width k in pixels (>= 0; 0 turns it off). With
   * delta = exterior distance estimate / pixel spacing, the exterior colour is
   * blended toward `edgeColour` by 1 - tanh(delta / k): full ink on the
   * boundary, half-way near delta = 0.55 k, gone by delta = 3 k
   * (docs/methods.md F2). Keeps filaments visible and crisp at any zoom.
   */
  readonly edge: number;
  /** Ink the edges fade to, '#rrggbb' (sRGB). Black darkens the boundary; white lightens it. */
  readonly edgeColour: string;
  /**
   * Interior colouring:
   * - `period`: the flat period-palette colour;
   * - `period-depth`: the period colour, darker toward the cycle's centre
   *   (scaled by 0.4 + 0.6 |multiplier| in linear light);
   * - `period-angle`: the period colour stepped by the internal angle
   *   arg(multiplier)/2pi (scaled by 0.7 + 0.3 * angle), so internal rays
   *   and the angle-0 ray to the root show;
   * - `period-depth-angle`: both factors;
   * - `solid`: every interior sample takes `interiorColour`.
   */
  readonly interior: InteriorStyle;
  /** Colour of interior samples when interior is `solid`, '#rrggbb'. */
  readonly interiorColour: string;
  /**
   * Interior edge width in pixels (>= 0; 0 turns it off): like `edge` but from
   * the interior distance estimate (docs/methods.md A6), so component outlines
   * stay sharp from inside as well.
   */
  readonly interiorEdge: number;
  /** Colour of samples that reached the iteration limit undecided, '#rrggbb'. */
  readonly undecidedColour: string;
  /**
   * The period legend: `none`; `inset`, drawn on the plate in `legendCorner`;
   * or `beside`, a separate SVG file next to the plate.
   */
  readonly legend: LegendPlacement;
  /** Which corner of the plate an inset legend sits in. */
  readonly legendCorner: LegendCorner;
  /**
   * The most periods a legend lists (1..64). The legend lists the periods
   * present in the view (legend.ts: at least LEGEND_MIN_PIXELS interior
   * pixels); when more are present it keeps the legendPeriods periods with the
   * most pixels, in increasing order of period.
   */
  readonly legendPeriods: number;
}

export const DEFAULT_COLOUR_SETTINGS: ColourSettings = {
  exterior: 'tidepool',
  countScale: 'log',
  cycle: 0.8,
  offset: 0,
  edge: 1.5,
  edgeColour: '#000000',
  interior: 'period-depth',
  interiorColour: '#000000',
  interiorEdge: 1,
  undecidedColour: '#000000',
  legend: 'none',
  legendCorner: 'bottom-right',
  legendPeriods: 12,
};

const KEYS = [
  'exterior',
  'gradient',
  'countScale',
  'cycle',
  'offset',
  'edge',
  'edgeColour',
  'interior',
  'interiorColour',
  'interiorEdge',
  'undecidedColour',
  'legend',
  'legendCorner',
  'legendPeriods',
] as const;
const MAX_EDGE_PIXELS = 1000;

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && Object.getPrototypeOf(v) === Object.prototype;
}

function rejectUnknownKeys(obj: Record<string, unknown>, known: readonly string[], field: string): void {
  for (const key of Object.keys(obj)) {
    if (!known.includes(key)) throw new UserError(`${field}.${key}`, `no such key (known: ${known.join(', ')})`, obj[key]);
  }
}

function oneOf<T extends string>(v: unknown, options: readonly T[], field: string): T {
  if (typeof v === 'string' && (options as readonly string[]).includes(v)) return v as T;
  throw new UserError(field, `one of ${options.map((o) => `"${o}"`).join(', ')}`, v);
}

function numberIn(v: unknown, field: string, min: number, max: number, minOpen: boolean, maxOpen: boolean): number {
  const ok = typeof v === 'number' && Number.isFinite(v) && (minOpen ? v > min : v >= min) && (maxOpen ? v < max : v <= max);
  if (!ok) {
    const range = `${minOpen ? '(' : '['}${min}, ${max}${maxOpen ? ')' : ']'}`;
    throw new UserError(field, `a number in ${range}`, v);
  }
  return v;
}

function hexColour(v: unknown, field: string): string {
  if (typeof v === 'string' && /^#[0-9a-fA-F]{6}$/.test(v)) return v.toLowerCase();
  throw new UserError(field, 'a colour "#rrggbb" (sRGB hex)', v);
}

/** A key of the colour block. */
export type ColourKey = (typeof KEYS)[number];

/**
 * Validates one field of the colour block, naming `field` in any error (the
 * sheet path 'colour.edge', or a flag and its field '--edge (colour.edge)').
 * Returns the checked value (colours in lower case).
 */
export function parseColourField(key: ColourKey, v: unknown, field: string): unknown {
  switch (key) {
    case 'exterior':
      return oneOf(v, EXTERIOR_GRADIENT_NAMES, field);
    case 'gradient':
      return parseGradientStops(v, field);
    case 'countScale':
      return oneOf(v, ['log', 'linear'] as const, field);
    case 'cycle':
      return numberIn(v, field, 0, 1e6, true, false);
    case 'offset':
      return numberIn(v, field, 0, 1, false, true);
    case 'edge':
    case 'interiorEdge':
      return numberIn(v, field, 0, MAX_EDGE_PIXELS, false, false);
    case 'edgeColour':
    case 'interiorColour':
    case 'undecidedColour':
      return hexColour(v, field);
    case 'interior':
      return oneOf(v, INTERIOR_STYLES, field);
    case 'legend':
      return oneOf(v, LEGEND_PLACEMENTS, field);
    case 'legendCorner':
      return oneOf(v, LEGEND_CORNERS, field);
    case 'legendPeriods':
      if (typeof v !== 'number' || !Number.isInteger(v) || v < 1 || v > PERIOD_PALETTE_SIZE) {
        throw new UserError(field, `an integer between 1 and ${PERIOD_PALETTE_SIZE}`, v);
      }
      return v;
  }
}

/**
 * Validates the `colour` block of a sheet (plain JSON) and fills defaults for
 * missing keys. Undefined gives the defaults. Throws UserError naming the exact
 * field (e.g. 'colour.edge', 'colour.legendCorner') on the first problem.
 */
export function parseColourSettings(value: unknown, field = 'colour'): ColourSettings {
  if (value === undefined) return DEFAULT_COLOUR_SETTINGS;
  if (!isPlainObject(value)) throw new UserError(field, 'an object of colour settings', value);
  rejectUnknownKeys(value, KEYS, field);
  const d = DEFAULT_COLOUR_SETTINGS as unknown as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  // legendPeriods is checked first, as it always was, so the first problem reported stays the same.
  const order: ColourKey[] = ['legendPeriods', ...KEYS.filter((k) => k !== 'legendPeriods')];
  for (const key of order) {
    const given = value[key];
    if (key === 'gradient' && given === undefined) continue;
    out[key] = parseColourField(key, given ?? d[key], `${field}.${key}`);
  }
  // Key order as in DEFAULT_COLOUR_SETTINGS (the gradient after exterior), so a recorded sheet reads the same.
  const ordered: Record<string, unknown> = {};
  for (const key of KEYS) if (key in out) ordered[key] = out[key];
  return ordered as unknown as ColourSettings;
}
