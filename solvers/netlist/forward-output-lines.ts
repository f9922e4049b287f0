import type { Output } from '../spec/spec-schema.js';
import { spiceNumber as n } from './spice-number.js';

const SNUBBER_RESISTANCE_OHM = 10;
/**
 * The rectifier snubbers' capacitance where the output inductor conducts continuously, F: 30 pF
 * (100 pF until 2026-12-05; the double-ended decks took 30 pF the same day). The engine holds no
 * rectifier capacitance; in the active clamp's dead time before turn-on, where the magnetizing
 * current carries the drain below Vin, the freewheel's snubber charges as the winding rises, and
 * with 100 pF it took some 0.03 A of the 0.08 A that moved the drain (the scan's 36–72 V active
 * clamp, seed 31 spec 23, at 72 V and 18 % load): about one point of its −2.9 % on the outputs
 * (DEVELOPERS.md, "The ngspice check", the audit of 2026-12-05). Where it runs discontinuous the
 * snubbers take 1 pF (`DISCONTINUOUS_SNUBBER_CAPACITANCE_F`): once the inductor current is at
 * zero, the inductor rings with the snubbers' capacitance, and 2 × 100 pF raised the simulated
 * output by 1–5 % at 3–10 % load; in continuous conduction the inductor never lets go, and 1 pF
 * there stalled ngspice (the ideal active clamp at full load, "timestep too small").
 */
const SNUBBER_CAPACITANCE_F = 30e-12;
const DISCONTINUOUS_SNUBBER_CAPACITANCE_F = 1e-12;

/** The values one buck-derived output of a forward netlist is built from (SI units). */
export interface ForwardOutputValues {
  turnsRatio: number;
  windingOhm: number;
  inductanceH: number;
  inductorOhm: number;
  output: Output;
  /** Output voltage and load current at the corner, V and A. */
  voltageV: number;
  loadA: number;
  /** Peak-to-peak inductor ripple at the corner, A. */
  rippleA: number;
  isContinuous: boolean;
  knee: { saturationCurrentA: number; slopeVoltageV: number };
}

/**
 * Returns the netlist lines of output `index` (1-based) of a forward netlist: an ideal-transformer
 * secondary across the magnetizing inductance (nodes p, b), its resistance, the forward and
 * freewheeling rectifiers, the output inductor, the capacitor with ESR and the load.
 */
export function forwardOutputLines(index: number, v: ForwardOutputValues): string[] {
  const k = String(index);
  const rectifier = v.output.rectifier;
  const forwardV = rectifier.kind === 'diode' ? rectifier.forwardVoltageV : 0;
  const slopeOhm = rectifier.kind === 'diode' ? rectifier.resistanceOhm : rectifier.onResistanceOhm;
  // The knee's own drop at the mean conduction current is taken out of the DC source.
  const meanA = v.isContinuous ? v.loadA : Math.max(v.rippleA / 2, 1e-6);
  const kneeV = v.knee.slopeVoltageV * Math.log1p(meanA / v.knee.saturationCurrentA);
  const valleyA = v.isContinuous ? v.loadA - v.rippleA / 2 : 0;
  const snubberF = v.isContinuous ? SNUBBER_CAPACITANCE_F : DISCONTINUOUS_SNUBBER_CAPACITANCE_F;
  const rectifierLines = (name: string, from: string) => [
    `D${name}${k} ${from} ${name}knee${k} knee`,
    `V${name}${k} ${name}knee${k} ${name}drop${k} DC ${n(forwardV - kneeV)}`,
    slopeOhm > 0
      ? `R${name}${k} ${name}drop${k} cathode${k} ${n(slopeOhm)}`
      : `V${name}r${k} ${name}drop${k} cathode${k} DC 0`,
  ];
  const lines = [
    `* Output ${k}: Np/Ns ${n(v.turnsRatio)}, ${n(v.voltageV)} V at ${n(v.loadA)} A`,
    `Esec${k} sec${k} rtn${k} p b ${n(1 / v.turnsRatio)}`,
    `Fsec${k} p b Vsec${k} ${n(1 / v.turnsRatio)}`,
    `Vsec${k} sec${k} wind${k} DC 0`,
    v.windingOhm > 0
      ? `Rsec${k} wind${k} fwd${k} ${n(v.windingOhm)}`
      : `Vsecr${k} wind${k} fwd${k} DC 0`,
    ...rectifierLines('fwd', `fwd${k}`),
    ...rectifierLines('fw', `rtn${k}`),
    `Lout${k} cathode${k} lo${k} ${n(v.inductanceH)} IC=${n(valleyA)}`,
    v.inductorOhm > 0
      ? `Rlout${k} lo${k} out${k} ${n(v.inductorOhm)}`
      : `Vlout${k} lo${k} out${k} DC 0`,
  ];
  if (v.output.capacitorEsrOhm > 0) {
    lines.push(
      `Resr${k} out${k} cap${k} ${n(v.output.capacitorEsrOhm)}`,
      `Cout${k} cap${k} rtn${k} ${n(v.output.capacitanceF)} IC=${n(v.voltageV)}`,
    );
  } else {
    lines.push(`Cout${k} out${k} rtn${k} ${n(v.output.capacitanceF)} IC=${n(v.voltageV)}`);
  }
  lines.push(
    `Rload${k} out${k} rtn${k} ${n(v.voltageV / v.loadA)}`,
    `Vref${k} rtn${k} 0 DC 0`,
    // RC snubbers across both rectifiers: without them the instant commutation of the inductor
    // current stalled ngspice ("timestep too small"). 30 pF keeps their loss and the ring they add
    // to the magnetizing current (Vin·√(C/Lm) after reset) small; 1 pF where the inductor current
    // stops (see DISCONTINUOUS_SNUBBER_CAPACITANCE_F).
    `Rsnfwd${k} fwd${k} snfwd${k} ${n(SNUBBER_RESISTANCE_OHM)}`,
    `Csnfwd${k} snfwd${k} cathode${k} ${n(snubberF)}`,
    `Rsnfw${k} rtn${k} snfw${k} ${n(SNUBBER_RESISTANCE_OHM)}`,
    `Csnfw${k} snfw${k} cathode${k} ${n(snubberF)}`,
  );
  return lines;
}
