/** vitest global setup: runs once per test run before any test file. */
export default async function setup(): Promise<void> {}
