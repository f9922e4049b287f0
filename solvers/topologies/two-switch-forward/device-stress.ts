import type { DeviceStress, ForwardCorner } from '../../design/design-schema.js';
import { resistiveLoss } from '../../losses/resistive-loss.js';
import { average } from '../../waveform/average.js';
import { peak } from '../../waveform/peak.js';
import { rms } from '../../waveform/rms.js';
import type { Waveform } from '../../waveform/waveform.js';

/** Returns a device's stress read off its current (A) and blocking-voltage (V) waveforms. */
export function deviceStress(
  name: string,
  currentA: Waveform,
  voltageV: Waveform,
  voltageRatingV: number | undefined,
): DeviceStress {
  const voltagePeakV = peak(voltageV);
  const currentPeakA = peak(currentA);
  const currentRmsA = rms(currentA);
  const currentAverageA = average(currentA);
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

/** Returns a winding's (or inductor's) stress and DC copper loss from its current waveform (A). */
export function windingStress(
  name: string,
  currentA: Waveform,
  resistanceOhm: number,
): ForwardCorner['windings'][number] {
  const currentRmsA = rms(currentA);
  return {
    name,
    currentRmsA,
    currentAverageA: average(currentA),
    currentPeakA: peak(currentA),
    resistanceOhm,
    copperLossW: resistiveLoss(currentRmsA, resistanceOhm),
  };
}
