import type { Waveform } from '../waveform/waveform.js';

/** One winding of the transformer as the converter drives it. */
export interface WindingDuty {
  /** A label, for example 'primary' or 'secondary-1'. */
  name: string;
  /** Turns of this winding per primary turn, Nk/Np (1 for the primary itself). */
  turnsPerPrimaryTurn: number;
  /**
   * What the winding serves: the primary, output `outputIndex` (a center-tapped output has two
   * windings of the same output), or the reset winding of a forward.
   */
  role: { kind: 'primary' } | { kind: 'output'; outputIndex: number } | { kind: 'reset' };
  /** The winding's current at each corner, A, in the order of {@link TransformerDuty.cornerLabels}. */
  currentsA: readonly Waveform[];
  /**
   * Index of an earlier winding whose current this one's is at every corner, shifted by half a
   * period (a push-pull's second primary half, a center tap's second half). Its harmonics have
   * that winding's magnitudes (a shift by T/2 multiplies harmonic n by (−1)ⁿ), so the copper
   * loss takes that winding's spectrum.
   */
  halfPeriodShiftOf?: number;
}

/**
 * What a solved converter asks of its transformer, read off its corners: the windings and their
 * currents, and the magnetizing current from which the flux follows. Plain data, SI units.
 */
export interface TransformerDuty {
  ambientTemperatureC: number;
  /** Labels of the corners, in the order every per-corner array follows. */
  cornerLabels: readonly string[];
  /** The windings: the primary first, then the first output's (regulated) winding. */
  windings: readonly WindingDuty[];
  /** Magnetizing inductance the corners were solved with, referred to the primary, H. */
  magnetizingInductanceH: number;
  /** Magnetizing current referred to the primary at each corner, A. */
  magnetizingCurrentsA: readonly Waveform[];
  /**
   * 'set-inductance': the core stores energy, and its gap is cut for magnetizingInductanceH
   * (flyback); 'ungapped': the core only transfers energy, and Lm is what the core gives.
   */
  gapRole: 'set-inductance' | 'ungapped';
}
