import { expect } from 'vitest';

/** Tolerance for {@link expectClose}: passes when |actual − expected| ≤ max(abs, rel·|expected|). */
export interface CloseTolerance {
  rel?: number;
  abs?: number;
}

/**
 * Asserts that `actual` is within max(abs, rel·|expected|) of `expected` (both default to 0).
 * Fails on NaN or ±Infinity in either number, since the engine must never produce them.
 */
export function expectClose(actual: number, expected: number, tolerance: CloseTolerance): void {
  const { rel = 0, abs = 0 } = tolerance;
  if (!(rel >= 0 && abs >= 0)) {
    throw new RangeError(
      `expectClose: tolerances must be non-negative, got rel ${rel}, abs ${abs}`,
    );
  }
  if (!Number.isFinite(actual) || !Number.isFinite(expected)) {
    throw new Error(`expectClose: non-finite number (actual ${actual}, expected ${expected})`);
  }
  const limit = Math.max(abs, rel * Math.abs(expected));
  const diff = Math.abs(actual - expected);
  expect(
    diff,
    `expected ${actual} to be within ${limit} of ${expected} (|diff| ${diff}; rel ${rel}, abs ${abs})`,
  ).toBeLessThanOrEqual(limit);
}

/** What {@link expectSwitchPeaksClose} reads of a deck's measures and of a design's switch. */
interface SwitchPeaks {
  switch_current_peak_a?: number;
  switch_voltage_peak_v?: number;
}

/**
 * Asserts that a deck's measured switch current and voltage peaks (`switch_current_peak_a`,
 * `switch_voltage_peak_v`) are within `rel` (issue 3's 5 % by default) of the design's first
 * switch's; fails where either is missing.
 */
export function expectSwitchPeaksClose(
  measures: SwitchPeaks,
  engineSwitch: { currentPeakA: number; voltagePeakV: number } | undefined,
  rel = 0.05,
): void {
  expectClose(measures.switch_current_peak_a ?? NaN, engineSwitch?.currentPeakA ?? NaN, { rel });
  expectClose(measures.switch_voltage_peak_v ?? NaN, engineSwitch?.voltagePeakV ?? NaN, { rel });
}
