import type { Corner } from '../design/design-schema.js';
import type { Output } from '../spec/spec-schema.js';
import { spiceNumber as n } from './spice-number.js';

/** The values one secondary of the flyback netlist is built from (SI units). */
export interface SecondaryValues {
  /** Np/Ns of this output. */
  turnsRatio: number;
  /** Winding resistance at the ambient, Ω. */
  windingOhm: number;
  output: Output;
  /** This output at the corner: its voltage and current set the load and the capacitor start. */
  cornerOutput: Corner['outputs'][number];
  /** Secondary conduction time over the period at the corner (0..1). */
  conductionFraction: number;
  /** Knee diode: saturation current, A, and N·kT/q, V. */
  knee: { saturationCurrentA: number; slopeVoltageV: number };
}

/**
 * Returns the netlist lines of secondary `index` (1-based): one ideal-transformer winding made of
 * controlled sources, its resistance, the rectifier, the output capacitor with ESR and the load
 * resistor. Output nodes are out<index> and rtn<index>.
 */
export function flybackSecondaryLines(index: number, v: SecondaryValues): string[] {
  const k = String(index);
  const { output, cornerOutput } = v;
  const rectifier = output.rectifier;
  // Linear model Vf + R·i: the diode rectifier's own, or a synchronous rectifier's channel
  // (Vf 0, R = Rds) gated by an ideal diode, as a controller that turns off at zero current does.
  const forwardV = rectifier.kind === 'diode' ? rectifier.forwardVoltageV : 0;
  const slopeOhm = rectifier.kind === 'diode' ? rectifier.resistanceOhm : rectifier.onResistanceOhm;
  // The knee adds N·Vt·ln(1 + i/IS); take it out at the mean current while the rectifier conducts
  // (the floor keeps a vanishing conduction interval from asking for an absurd mean).
  const meanA = cornerOutput.currentA / Math.max(v.conductionFraction, 0.05);
  const kneeV = v.knee.slopeVoltageV * Math.log1p(meanA / v.knee.saturationCurrentA);
  const lines = [
    `* Output ${k}${output.name === undefined ? '' : ` (${output.name.replace(/[^\w .-]/g, '_')})`}: ` +
      `Np/Ns ${n(v.turnsRatio)}, ${n(cornerOutput.voltageV)} V at ${n(cornerOutput.currentA)} A`,
    // The dot end is the return: the rectifier blocks while the switch is on.
    `Esec${k} rtn${k} sec${k} mag drain ${n(1 / v.turnsRatio)}`,
    `Fsec${k} mag drain Vsec${k} ${n(-1 / v.turnsRatio)}`,
    `Vsec${k} sec${k} wind${k} DC 0`,
  ];
  let node = `wind${k}`;
  if (v.windingOhm > 0) {
    lines.push(`Rsec${k} wind${k} rect${k} ${n(v.windingOhm)}`);
    node = `rect${k}`;
  }
  // No RC snubber across the rectifier: with the knee diode it stalled ngspice's step control
  // (steps near 1e-14 s) in synchronous cases, and runs are robust without one.
  lines.push(
    `Drect${k} ${node} knee${k} knee`,
    `Vfwd${k} knee${k} ${slopeOhm > 0 ? `drop${k}` : `out${k}`} DC ${n(forwardV - kneeV)}`,
  );
  if (slopeOhm > 0) lines.push(`Rrect${k} drop${k} out${k} ${n(slopeOhm)}`);
  if (output.capacitorEsrOhm > 0) {
    lines.push(
      `Resr${k} out${k} cap${k} ${n(output.capacitorEsrOhm)}`,
      `Cout${k} cap${k} rtn${k} ${n(output.capacitanceF)} IC=${n(cornerOutput.voltageV)}`,
    );
  } else {
    lines.push(`Cout${k} out${k} rtn${k} ${n(output.capacitanceF)} IC=${n(cornerOutput.voltageV)}`);
  }
  lines.push(
    `Rload${k} out${k} rtn${k} ${n(cornerOutput.voltageV / cornerOutput.currentA)}`,
    // The isolated return needs a reference; no current flows in it (the secondary touches the
    // rest only here). A resistor instead would leave the secondary's potential loosely pinned,
    // jittering by reltol times the largest current times its value, which stalls the steps.
    `Vref${k} rtn${k} 0 DC 0`,
  );
  return lines;
}
