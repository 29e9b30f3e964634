import { UserError } from '../cli/user-error.js';
import { EXTERIOR_GRADIENT_NAMES, type ExteriorGradientName } from './exterior-gradients.js';
import { PERIOD_PALETTE_SIZE } from './period-palette.js';

/** How interior (attracting-cycle) samples are coloured. */
export type InteriorStyle = 'period' | 'period-depth' | 'period-angle' | 'period-depth-angle' | 'solid';
export const INTERIOR_STYLES: readonly InteriorStyle[] = ['period', 'period-depth', 'period-angle', 'period-depth-angle', 'solid'];

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
  /** Exterior gradient name (exterior-gradients.ts): tidepool, heather, brass, vellum. */
  readonly exterior: ExteriorGradientName;
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
   * (methods.md F2). Keeps filaments visible and crisp at any zoom.
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
   * the interior distance estimate (methods.md A6), so component outlines
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
  /** The legend lists periods 1..legendPeriods (1..64). */
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
  const ok =
    typeof v === 'number' &&
    Number.isFinite(v) &&
    (minOpen ? v > min : v >= min) &&
    (maxOpen ? v < max : v <= max);
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

/**
 * Validates the `colour` block of a sheet (plain JSON) and fills defaults for
 * missing keys. Undefined gives the defaults. Throws UserError naming the exact
 * field (e.g. 'colour.edge', 'colour.legendCorner') on the first problem.
 */
export function parseColourSettings(value: unknown, field = 'colour'): ColourSettings {
  if (value === undefined) return DEFAULT_COLOUR_SETTINGS;
  if (!isPlainObject(value)) throw new UserError(field, 'an object of colour settings', value);
  rejectUnknownKeys(value, KEYS, field);
  const d = DEFAULT_COLOUR_SETTINGS;
  const get = (key: (typeof KEYS)[number]): unknown => value[key];
  const f = (key: string): string => `${field}.${key}`;

  const legendPeriods = get('legendPeriods') ?? d.legendPeriods;
  if (typeof legendPeriods !== 'number' || !Number.isInteger(legendPeriods) || legendPeriods < 1 || legendPeriods > PERIOD_PALETTE_SIZE) {
    throw new UserError(f('legendPeriods'), `an integer between 1 and ${PERIOD_PALETTE_SIZE}`, legendPeriods);
  }

  return {
    exterior: oneOf(get('exterior') ?? d.exterior, EXTERIOR_GRADIENT_NAMES, f('exterior')),
    countScale: oneOf(get('countScale') ?? d.countScale, ['log', 'linear'] as const, f('countScale')),
    cycle: numberIn(get('cycle') ?? d.cycle, f('cycle'), 0, 1e6, true, false),
    offset: numberIn(get('offset') ?? d.offset, f('offset'), 0, 1, false, true),
    edge: numberIn(get('edge') ?? d.edge, f('edge'), 0, MAX_EDGE_PIXELS, false, false),
    edgeColour: hexColour(get('edgeColour') ?? d.edgeColour, f('edgeColour')),
    interior: oneOf(get('interior') ?? d.interior, INTERIOR_STYLES, f('interior')),
    interiorColour: hexColour(get('interiorColour') ?? d.interiorColour, f('interiorColour')),
    interiorEdge: numberIn(get('interiorEdge') ?? d.interiorEdge, f('interiorEdge'), 0, MAX_EDGE_PIXELS, false, false),
    undecidedColour: hexColour(get('undecidedColour') ?? d.undecidedColour, f('undecidedColour')),
    legend: oneOf(get('legend') ?? d.legend, LEGEND_PLACEMENTS, f('legend')),
    legendCorner: oneOf(get('legendCorner') ?? d.legendCorner, LEGEND_CORNERS, f('legendCorner')),
    legendPeriods,
  };
}
