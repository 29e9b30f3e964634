/**
 * Tests that need an outside tool (chromium, redis-server, numpy, mpmath)
 * skip without it on a developer's machine, but in CI (CI=true) its absence
 * fails the run loudly: .ci/run installs every one of them.
 */
export function requireInCi(have: boolean, what: string): boolean {
  if (!have && process.env['CI'] === 'true') throw new Error(`${what} is missing, and CI=true: .ci/run must install it`);
  return have;
}
