import type { Output } from '../spec/spec-schema.js';
import { spiceNumber as n } from './spice-number.js';

const SNUBBER_RESISTANCE_OHM = 10;
/**
 * The rectifier snubbers' capacitance where the output inductor conducts continuously and the
 * freewheel carries the magnetizing current, F: 30 pF (100 pF until 2026-12-05, as the forward
 * decks' still are). As the turn-on commutation ends the off rectifier's voltage steps up and its
 * snubber charges through the leakage; the push-pull with its clamp measures the switch current
 * from three gate edges into the on-time (its turn-on ring), where with 100 pF that charge added
 * 0.25 A on the primary, +9 % on the scan's 36–72 V push-pull with 0.2 µH (seed 37, spec 0); the
 * engine holds no rectifier capacitance. Smaller is not better throughout: the same design's
 * drain peaks move with the snubbers' capacitance (at 36 V, full load, 10 pF read +6.7 % and 1 pF
 * +8.4 % on the switch voltage; at 21 % load 1 pF read −5.4 %), so 30 pF is a compromise
 * (DEVELOPERS.md, "The ngspice check", the audit of 2026-12-05); the push-pull with its clamp takes
 * 1 pF since its turn-off spike is stepped in the engine (`hasClampedLeakage`). Where it runs discontinuous,
 * or the corner has a shared fall (the light-load ring), the snubbers take 1 pF
 * (`DISCONTINUOUS_SNUBBER_CAPACITANCE_F`), as in the forward decks: once the inductor current is
 * at zero the snubbers' capacitance (4 × for a center-tapped winding's node, 2 × for a bridge)
 * adds to the node ring's capacitance on the secondary; below 5 % load 100 pF raised a full
 * bridge's simulated output by some 10 % (DEVELOPERS.md, "Light load below 5 %"). A real
 * rectifier's tens of pF here with the engine lumping 4·C/n² (2·C/n² a bridge) onto the node was
 * tried and missed a three-output full bridge by up to 8 % (DEVELOPERS.md, "The rectifiers'
 * capacitance in the deck").
 */
const SNUBBER_CAPACITANCE_F = 30e-12;
const DISCONTINUOUS_SNUBBER_CAPACITANCE_F = 1e-12;

/** The values one output of a push-pull or bridge netlist is built from (SI units). */
export interface DoubleEndedOutputValues {
  turnsRatio: number;
  arrangement: 'center-tapped' | 'full-bridge';
  /** Each half's (center-tapped) or the winding's resistance, Ω. */
  windingOhm: number;
  inductanceH: number;
  inductorOhm: number;
  output: Output;
  /** Output voltage and load current at the corner, V and A. */
  voltageV: number;
  loadA: number;
  /** Inductor current at the start of the simulation (its valley, 0 in DCM), A. */
  startA: number;
  /**
   * Whether the output inductor conducts through the period (its mode at the corner is not `dcm`)
   * and the freewheel carries the magnetizing current (no shared fall).
   */
  isContinuous: boolean;
  /**
   * Whether the primary is the push-pull's with leakage and its clamp, whose turn-off spike the
   * engine steps with each drain behind its leakage and no rectifier capacitance: its snubbers
   * take 1 pF throughout. With 30 pF they slowed the winding's fall at the turn-off and took the
   * drain's peak below the engine's where it stays under the clamp (the scan's seed 37, spec 0,
   * 0.2 µH, at 36 V and full load: −5.9 % at 30 pF, −1.6 % at 1 pF; DEVELOPERS.md, "The
   * push-pull's turn-off spike against a ring-resolved deck"). @defaultValue false
   */
  hasClampedLeakage?: boolean;
  /** Winding the secondaries are coupled to: its two nodes, dot first. */
  reference: readonly [string, string];
  knee: { saturationCurrentA: number; slopeVoltageV: number };
}

/**
 * Returns the netlist lines of output `index` (1-based): ideal-transformer windings made of E/F
 * sources across the reference winding (one with its rectifier per half for a center-tapped
 * secondary, one winding into four rectifiers for a bridge), each rectifier a knee diode plus a
 * DC source and its slope resistance with an RC snubber across it, the output inductor, the
 * capacitor with ESR and the load.
 */
export function doubleEndedOutputLines(index: number, v: DoubleEndedOutputValues): string[] {
  const k = String(index);
  const [dot, undot] = v.reference;
  const gain = n(1 / v.turnsRatio);
  const rectifier = v.output.rectifier;
  const forwardV = rectifier.kind === 'diode' ? rectifier.forwardVoltageV : 0;
  const slopeOhm = rectifier.kind === 'diode' ? rectifier.resistanceOhm : rectifier.onResistanceOhm;
  // The knee's own drop near the mean conduction current is taken out of the DC source.
  const kneeV = v.knee.slopeVoltageV * Math.log1p((0.75 * v.loadA) / v.knee.saturationCurrentA);
  const snubberF =
    v.isContinuous && v.hasClampedLeakage !== true
      ? SNUBBER_CAPACITANCE_F
      : DISCONTINUOUS_SNUBBER_CAPACITANCE_F;
  const rectifierLines = (name: string, from: string, to: string) => [
    `D${name} ${from} ${name}knee knee`,
    `V${name} ${name}knee ${name}drop DC ${n(forwardV - kneeV)}`,
    slopeOhm > 0 ? `R${name} ${name}drop ${to} ${n(slopeOhm)}` : `V${name}r ${name}drop ${to} DC 0`,
    `R${name}sn ${from} ${name}sn ${n(SNUBBER_RESISTANCE_OHM)}`,
    `C${name}sn ${name}sn ${to} ${n(snubberF)}`,
  ];
  const resistor = (name: string, a: string, b: string, ohm: number) =>
    ohm > 0 ? `R${name} ${a} ${b} ${n(ohm)}` : `V${name} ${a} ${b} DC 0`;
  const cathode = `cathode${k}`;
  const rtn = `rtn${k}`;
  const lines = [`* Output ${k}: Np/Ns ${n(v.turnsRatio)}, ${v.arrangement} secondary`];
  if (v.arrangement === 'center-tapped') {
    // Half a: dot at its outer end; half b: dot at the center tap (rtn), so they alternate.
    lines.push(
      `Esa${k} sa${k} ${rtn} ${dot} ${undot} ${gain}`,
      `Fsa${k} ${dot} ${undot} Vsa${k} ${gain}`,
      `Vsa${k} sa${k} wa${k} DC 0`,
      resistor(`wa${k}`, `wa${k}`, `ra${k}`, v.windingOhm),
      ...rectifierLines(`ra${k}`, `ra${k}`, cathode),
      `Esb${k} ${rtn} sb${k} ${dot} ${undot} ${gain}`,
      `Fsb${k} ${undot} ${dot} Vsb${k} ${gain}`,
      `Vsb${k} sb${k} wb${k} DC 0`,
      resistor(`wb${k}`, `wb${k}`, `rb${k}`, v.windingOhm),
      ...rectifierLines(`rb${k}`, `rb${k}`, cathode),
    );
  } else {
    lines.push(
      `Es${k} s${k} nb${k} ${dot} ${undot} ${gain}`,
      `Fs${k} ${dot} ${undot} Vs${k} ${gain}`,
      `Vs${k} s${k} ws${k} DC 0`,
      resistor(`ws${k}`, `ws${k}`, `na${k}`, v.windingOhm),
      ...rectifierLines(`rau${k}`, `na${k}`, cathode),
      ...rectifierLines(`ral${k}`, rtn, `nb${k}`),
      ...rectifierLines(`rbu${k}`, `nb${k}`, cathode),
      ...rectifierLines(`rbl${k}`, rtn, `na${k}`),
    );
  }
  lines.push(
    `Lout${k} ${cathode} lo${k} ${n(v.inductanceH)} IC=${n(v.startA)}`,
    resistor(`lout${k}`, `lo${k}`, `out${k}`, v.inductorOhm),
  );
  if (v.output.capacitorEsrOhm > 0) {
    lines.push(
      `Resr${k} out${k} cap${k} ${n(v.output.capacitorEsrOhm)}`,
      `Cout${k} cap${k} ${rtn} ${n(v.output.capacitanceF)} IC=${n(v.voltageV)}`,
    );
  } else {
    lines.push(`Cout${k} out${k} ${rtn} ${n(v.output.capacitanceF)} IC=${n(v.voltageV)}`);
  }
  lines.push(`Rload${k} out${k} ${rtn} ${n(v.voltageV / v.loadA)}`, `Vref${k} ${rtn} 0 DC 0`);
  return lines;
}
