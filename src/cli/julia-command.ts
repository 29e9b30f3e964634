/**
 * The `quadatlas julia` command line for a parameter c, printed by the
 * commands that report one c (probe), so the dynamical plane of
 * a c found in the parameter plane is one copy-paste away. The decimal
 * strings are passed as written.
 */
export function juliaCommandLine(re: string, im: string, extra: readonly string[] = []): string {
  return ['quadatlas', 'julia', '--c', `${re},${im}`, ...extra].join(' ');
}
