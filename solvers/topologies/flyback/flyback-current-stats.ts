import { average } from '../../waveform/average.js';
import { peak } from '../../waveform/peak.js';
import { rms } from '../../waveform/rms.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { FlybackCircuit } from './flyback-circuit.js';
import type { FlybackCurrentWaveforms } from './flyback-current-waveforms.js';

/** Mean, RMS and peak of one current waveform, A. */
export interface CurrentStats {
  averageA: number;
  rmsA: number;
  peakA: number;
}

/** The statistics every stress and loss of a corner reads, computed once per waveform. */
export interface FlybackCurrentStats {
  switchA: CurrentStats;
  primaryWindingA: CurrentStats;
  referredSecondaryA: CurrentStats;
  /** Secondary k carries αk·i', so its statistics are αk times those of i' (αk > 0). */
  secondariesA: CurrentStats[];
}

/** Returns the mean, RMS and peak of the corner's currents, from the waveform kernel. */
export function flybackCurrentStats(
  circuit: FlybackCircuit,
  currents: FlybackCurrentWaveforms,
): FlybackCurrentStats {
  const referred = statsOf(currents.referredSecondaryA);
  return {
    switchA: statsOf(currents.switchA),
    primaryWindingA: statsOf(currents.primaryWindingA),
    referredSecondaryA: referred,
    secondariesA: circuit.outputs.map(({ currentShare }) => ({
      averageA: currentShare * referred.averageA,
      rmsA: currentShare * referred.rmsA,
      peakA: currentShare * referred.peakA,
    })),
  };
}

function statsOf(w: Waveform): CurrentStats {
  return { averageA: average(w), rmsA: rms(w), peakA: peak(w) };
}
