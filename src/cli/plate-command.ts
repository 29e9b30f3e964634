/**
 * The `quadatlas plate` command line that frames a navigation result (a
 * probed c, a nucleus, a Misiurewicz point), printed beside the `julia`
 * command so a place found by combinatorics is one copy-paste from its
 * picture. The centre is passed as written; the span is a short decimal.
 */
export function plateCommandLine(re: string, im: string, span: number, extra: readonly string[] = []): string {
  const s = Number.isFinite(span) && span > 0 ? span.toPrecision(3) : '3.2';
  return ['quadatlas', 'plate', '--center', `${re},${im}`, '--span', s, '--iterations', 'auto', ...extra].join(' ');
}

/**
 * Span for a component of period p and size estimate s (docs/methods.md C4):
 * the copy's cardioid or disk spans about 4 s, and a frame of 10 s shows it
 * with its decorations. `log10Size` carries sizes below the double range.
 */
export function componentSpan(size: number, log10Size: number): number {
  return size > 0 ? 10 * size : 10 * 10 ** log10Size;
}
