import { expect } from 'vitest';

/** |actual − expected| ≤ abs + rel·|expected|, with a message that shows both. */
export function expectClose(actual: number, expected: number, rel = 1e-10, abs = 0): void {
  const allowed = abs + rel * Math.abs(expected);
  expect(Number.isFinite(actual), `expected a finite number, got ${actual}`).toBe(true);
  expect(Math.abs(actual - expected), `${actual} vs ${expected} (allowed ±${allowed})`).toBeLessThanOrEqual(allowed);
}
