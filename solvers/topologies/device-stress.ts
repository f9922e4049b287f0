import type { DeviceStress, ForwardCorner } from '../design/design-schema.js';
import { resistiveLoss } from '../losses/resistive-loss.js';
import { peak } from '../waveform/peak.js';
import type { Waveform } from '../waveform/waveform.js';
import {
  waveformStats,
  type WaveformStats,
  type WaveformStatsMemo,
} from '../waveform/waveform-stats.js';

/** Scratch for the current's stats (read out before anything else uses it). */
const STATS: WaveformStats = { peak: 0, rms: 0, average: 0 };

/**
 * Returns a device's stress read off its current (A) and blocking-voltage (V) waveforms (the
 * current's stats from `memo` where given).
 */
export function deviceStress(
  name: string,
  currentA: Waveform,
  voltageV: Waveform,
  voltageRatingV: number | undefined,
  memo?: WaveformStatsMemo,
): DeviceStress {
  const voltagePeakV = peak(voltageV);
  // peak, rms and average of the current from one pass (the same numbers), or from `memo`.
  const stats = memo === undefined ? waveformStats(currentA, STATS) : memo.of(currentA);
  return deviceStressOf(name, stats.peak, stats.rms, stats.average, voltagePeakV, voltageRatingV);
}

/** A device's stress from its current's peak, RMS and mean, A, and its voltage peak, V. */
export function deviceStressOf(
  name: string,
  currentPeakA: number,
  currentRmsA: number,
  currentAverageA: number,
  voltagePeakV: number,
  voltageRatingV: number | undefined,
): DeviceStress {
  // Two literals rather than a spread of a shared base: the spread cost several µs a call here.
  return voltageRatingV === undefined
    ? { name, currentPeakA, currentRmsA, currentAverageA, voltagePeakV }
    : {
        name,
        currentPeakA,
        currentRmsA,
        currentAverageA,
        voltagePeakV,
        voltageRatingV,
        voltageUtilization: voltagePeakV / voltageRatingV,
      };
}

/**
 * Returns a winding's (or inductor's) stress and DC copper loss from its current waveform (A)
 * (its stats from `memo` where given).
 */
export function windingStress(
  name: string,
  currentA: Waveform,
  resistanceOhm: number,
  memo?: WaveformStatsMemo,
): ForwardCorner['windings'][number] {
  const stats = memo === undefined ? waveformStats(currentA, STATS) : memo.of(currentA);
  return windingOf(name, stats.rms, stats.average, stats.peak, resistanceOhm);
}

/** A winding's stress from its current's RMS, mean and peak, A, and its DC copper loss. */
export function windingOf(
  name: string,
  currentRmsA: number,
  currentAverageA: number,
  currentPeakA: number,
  resistanceOhm: number,
): ForwardCorner['windings'][number] {
  return {
    name,
    currentRmsA,
    currentAverageA,
    currentPeakA,
    resistanceOhm,
    copperLossW: resistiveLoss(currentRmsA, resistanceOhm),
  };
}

/**
 * {@link windingStress} of a winding that carries the very current of a device already
 * stressed (a push-pull's primary half is its switch's): the same numbers, read off the device's.
 */
export function windingStressOfDevice(
  name: string,
  device: DeviceStress,
  resistanceOhm: number,
): ForwardCorner['windings'][number] {
  return windingOf(
    name,
    device.currentRmsA,
    device.currentAverageA,
    device.currentPeakA,
    resistanceOhm,
  );
}

/**
 * {@link deviceStress} of a device that carries the very current and blocks the very voltage of
 * one already stressed (a bridge rectifier's partner on the same side): its numbers, renamed.
 */
export function deviceStressAs(name: string, device: DeviceStress): DeviceStress {
  return deviceStressOf(
    name,
    device.currentPeakA,
    device.currentRmsA,
    device.currentAverageA,
    device.voltagePeakV,
    device.voltageRatingV,
  );
}
