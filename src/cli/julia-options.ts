/**
 * The options of `quadatlas julia`, declared once: the view, size, colour and
 * output flags of `plate` (same meaning, read in z) plus the parameter, the
 * interior colouring and the marks. Options of plates that mean nothing in
 * the dynamical plane are declared so they can be refused in one line.
 */
import { attributeName, PLATE_OPTIONS } from './plate-options.js';
import type { OptionSpec } from './option-spec.js';
import { Received, UserError } from '../check/user-error.js';

/** Figure flags of plates whose Julia meaning differs: `--rays` (dynamic rays here, declared below) and those read in z. */
const REPLACED = new Set(['--rays <angles>', '--axes', '--scale-bar', '--equipotentials <n>', '--marks <file.csv>', '--center <re,im>', '--span <width>']);

/** Plate flags that have no meaning on a Julia plate: refused in one line naming the flag. */
const REFUSED = new Set(['--label-periods <n>', '--reference <re,im,period>', '--no-skip', '--rays-of <period>', '--outlines <period>', '--internal-rays <spec>']);

/** What each refused flag belongs to, for its one-line refusal. */
const REFUSED_WHY: Readonly<Record<string, string>> = {
  '--label-periods': 'period labels belong to the c-plane',
  '--reference': 'the deep reference is a parameter-plane nucleus',
  '--no-skip': 'the bilinear skipping of the c-plane is not used on Julia plates',
  '--rays-of': "rays of a period's components are parameter rays; use --rays ANGLES for dynamic rays",
  '--outlines': 'component outlines belong to the c-plane',
  '--internal-rays': 'internal rays belong to components of the c-plane',
};

function sub(sheet: Record<string, unknown>, key: string): Record<string, unknown> {
  const v = sheet[key];
  if (typeof v === 'object' && v !== null && !Array.isArray(v)) return v as Record<string, unknown>;
  const fresh: Record<string, unknown> = {};
  sheet[key] = fresh;
  return fresh;
}

export const JULIA_OPTIONS: readonly OptionSpec[] = [
  {
    flags: '--c <re,im>',
    description: 'the parameter c as two decimal numbers, e.g. -0.12256116687665,0.74486176661974, kept as written (required unless --cardioid-angle or a sheet gives c; sheet c)',
    apply: (s, v) => {
      const parts = v.split(',');
      if (parts.length !== 2) throw new UserError('--c', 'two decimal numbers RE,IM (e.g. -1,0)', v);
      s['c'] = { re: parts[0]!.trim(), im: parts[1]!.trim() };
      delete s['cardioidAngle'];
    },
  },
  {
    flags: '--cardioid-angle <theta>',
    description:
      'c on the main cardioid at internal angle theta: c = m/2 - m^2/4, m = e^(2 pi i theta); s/q or a decimal gives a parabolic c, golden the golden-mean Siegel disk (default: use --c)',
    apply: (s, v) => void (s['cardioidAngle'] = v.trim()),
  },
  {
    flags: '--basin <style>',
    description: 'interior colouring: point (the cycle point attracting it), time (attraction time) or point-time (default)',
    apply: (s, v) => void (s['basin'] = v.trim()),
  },
  {
    flags: '--orbit <n>',
    description: 'mark the first n points of the critical orbit (default 0: none; sheet marks.orbit)',
    apply: (s, v) => void (sub(s, 'marks')['orbit'] = /^\s*\d+\s*$/.test(v) ? Number(v) : v),
  },
  { flags: '--cycle', description: 'mark the attracting (or parabolic) cycle (default: not marked; sheet marks.cycle)' },
  { flags: '--fixed-points', description: 'mark the fixed points alpha (red) and beta (blue) (default: not marked; sheet marks.fixedPoints)' },
  {
    flags: '--rays <angles>',
    description: 'draw the dynamic rays of these angles, e.g. 1/7,2/7,4/7 (default: none; sheet marks.rays)',
    apply: (s, v) => void (sub(s, 'marks')['rays'] = v.split(',').map((a) => a.trim())),
  },
  ...PLATE_OPTIONS.filter((o) => !REFUSED.has(o.flags) && !REPLACED.has(o.flags)).flatMap((o) => {
    const plate = (flags: string): OptionSpec => PLATE_OPTIONS.find((p) => p.flags === flags)!;
    // the view and the figure flags read in z, placed where plates have them
    if (o.flags.startsWith('--size'))
      return [
        { ...plate('--center <re,im>'), description: 'centre of the view in z as two decimal numbers (default 0,0)' },
        { ...plate('--span <width>'), description: 'width of the view in z units (default 4)' },
        o,
      ];
    if (o.flags.startsWith('--caption')) {
      return [
        { flags: '--axes', description: 'figures: frame, ticks and labels in Re z and Im z outside the image; not with --rotation (default: none; sheet figure.axes)' },
        {
          flags: '--scale-bar',
          description: 'figures: a bar of a round length in z, labelled with it, in the lower left corner of the plate (default: none; sheet figure.scaleBar)',
        },
        o,
        {
          ...plate('--equipotentials <n>'),
          description:
            'figures: n level curves of the potential G_c(z), G_0 / 2^k for k = 0..n-1 with G_0 the largest in view, n from 0 (none) to 64 (default 0; sheet figure.equipotentials)',
        },
        {
          flags: '--marks <file.csv>',
          description: 'figures: labelled points z from a CSV file of rows re,im,label; the rows are recorded in the sheet (default none; sheet figure.marks)',
        },
      ];
    }
    return [o];
  }),
  ...[...REFUSED].map((flags) => ({ flags, description: 'not on Julia plates: refused in one line (default: absent)' })),
];

/** Applies flag values to a raw Julia sheet object, refusing plate-only flags. */
export function applyJuliaOptions(sheet: Record<string, unknown>, values: Record<string, unknown>): Record<string, unknown> {
  for (const flags of REFUSED) {
    const key = attributeName(flags);
    const given = flags.startsWith('--no-') ? values[key] === false : values[key] !== undefined;
    const flag = flags.split(' ')[0]!;
    if (given)
      throw new UserError(
        flag,
        `an option of Julia plates (${REFUSED_WHY[flag] ?? 'this one belongs to c-plane plates'})`,
        new Received(typeof values[key] === 'string' ? `${flag} ${String(values[key])}` : flag),
      );
  }
  for (const spec of JULIA_OPTIONS) {
    if (!spec.apply) continue;
    const v = values[attributeName(spec.flags)];
    if (typeof v === 'string') spec.apply(sheet, v);
  }
  if (values['cycle'] === true) sub(sheet, 'marks')['cycle'] = true;
  if (values['fixedPoints'] === true) sub(sheet, 'marks')['fixedPoints'] = true;
  if (values['sidecar'] === false) sub(sheet, 'output')['sidecar'] = false;
  if (values['axes'] === true) sub(sheet, 'figure')['axes'] = true;
  if (values['scaleBar'] === true) sub(sheet, 'figure')['scaleBar'] = true;
  return sheet;
}
