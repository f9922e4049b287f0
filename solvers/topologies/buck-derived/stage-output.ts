import type { CornerOutput } from '../../design/design-parts-schema.js';
import type { Output } from '../../spec/spec-schema.js';
import { acRms } from '../../waveform/ac-rms.js';
import type { Waveform } from '../../waveform/waveform.js';
import type { WaveformStatsMemo } from '../../waveform/waveform-stats.js';
import { flybackOutputRippleV } from '../flyback/flyback-output-ripple.js';

/**
 * Returns one output of a buck-derived corner: its voltage (V) and load (A), the capacitor's RMS
 * ripple current (the inductor current less its mean, by charge balance) and the peak-to-peak
 * output ripple from capacitance and ESR over `rippleCurrentA` (the inductor current over the
 * interval that repeats: a period, or half of one at twice the switching frequency). `memo`, where
 * given, has the inductor current's stats (the same numbers).
 */
export function stageOutput(
  output: Output,
  voltageV: number,
  loadA: number,
  inductorA: Waveform,
  rippleCurrentA: Waveform = inductorA,
  memo?: WaveformStatsMemo,
): CornerOutput {
  return {
    voltageV,
    currentA: loadA,
    capacitorRippleCurrentRmsA: acRms(inductorA, memo),
    rippleVoltagePeakToPeakV: flybackOutputRippleV(
      rippleCurrentA,
      loadA,
      output.capacitanceF,
      output.capacitorEsrOhm,
    ),
  };
}
