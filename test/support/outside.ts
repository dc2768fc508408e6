/**
 * Tests that need something from outside the project (Debian's Chromium or python3 packages, the open datasets
 * in ../shared/data/) call this when it is missing: under CI=true the run fails, because CI must have it;
 * elsewhere the test skips with a loud line saying what to install.
 */
export function missingOutside(message: string): void {
  if (process.env.CI === 'true') throw new Error(message);
  console.warn(`\n*** ${message}\n`);
}
