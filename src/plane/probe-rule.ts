/**
 * The rule that raises an `auto` iteration limit from a probe of the view
 * (docs/methods.md B9), apart from what samples the probe: limits
 * start, 2 start, 4 start, ... until some probe pixel is decided and at most
 * `tolerance` of them were decided over the last doubling; then `margin`
 * times that limit, never above the ceiling (which also ends a probe that
 * never decides anything). Pure: the result depends only on the counts
 * `undecidedAt` returns, which must be a function of the limit alone.
 */

/** The probe's constants, recorded beside the limit they gave. */
export interface ProbeRule {
  /** First probe limit. */
  readonly start: number;
  /** The probe grid's longer side in pixels (never more than the plate's). */
  readonly side: number;
  /** The plate's limit is margin x the probe limit at which the count stopped changing. */
  readonly margin: number;
  /** "Stopped changing": at most this fraction of the probe pixels decided over one doubling. */
  readonly tolerance: number;
}

export const PROBE_RULE: ProbeRule = { start: 1024, side: 64, margin: 2, tolerance: 1e-3 };

/** One probe pass: its limit and how many probe pixels stayed undecided. */
export interface ProbeLevel {
  readonly limit: number;
  readonly undecided: number;
}

export interface ProbeOutcome {
  /** The plate's iteration limit. */
  readonly limit: number;
  /** Why the probe stopped: the count stopped changing, or the ceiling was reached. */
  readonly stop: 'stable' | 'ceiling';
  readonly levels: ProbeLevel[];
}

/** The probe grid for a plate of width x height: the same view at most `side` pixels on its longer side. */
export function probeSize(width: number, height: number, side: number): { width: number; height: number } {
  const scale = Math.min(1, side / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

/** Raises the limit over a probe of `count` pixels; `undecidedAt(limit)` samples them all at that limit. */
export function raiseLimit(count: number, ceiling: number, undecidedAt: (limit: number) => number, rule: ProbeRule = PROBE_RULE): ProbeOutcome {
  const tolerance = Math.floor(rule.tolerance * count);
  const levels: ProbeLevel[] = [];
  for (let limit = Math.min(rule.start, ceiling); ; limit = Math.min(2 * limit, ceiling)) {
    const undecided = undecidedAt(limit);
    levels.push({ limit, undecided });
    const previous = levels.length >= 2 ? levels[levels.length - 2]! : null;
    if (previous !== null && undecided < count && previous.undecided - undecided <= tolerance) {
      return { limit: Math.min(ceiling, rule.margin * limit), stop: 'stable', levels };
    }
    if (limit >= ceiling) return { limit: ceiling, stop: 'ceiling', levels };
  }
}
