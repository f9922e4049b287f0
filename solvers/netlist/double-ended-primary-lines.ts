import { spiceNumber as n } from './spice-number.js';

/** The values the primary of a push-pull or bridge netlist is built from (SI units). */
export interface DoubleEndedPrimaryValues {
  kind: 'push-pull' | 'half-bridge' | 'full-bridge';
  inputVoltageV: number;
  magnetizingInductanceH: number;
  /** Magnetizing current at the start of the simulation, A. */
  magnetizingStartA: number;
  leakageInductanceH: number;
  primaryOhm: number;
  drainCapacitanceF: number;
  /** Capacitance of each half-bridge divider capacitor, F. */
  dividerCapacitanceF: number;
  /**
   * The resistor across the leakage over √(Llk/Coss) (3 unless given; see
   * `doubleEndedNetlist` for where it is lighter: the push-pull with its clamp, and the bridges'
   * light-load ring).
   */
  leakageDampingRatio?: number;
  /**
   * Push-pull with leakage: the RCD clamp, a diode from each drain to a capacitor held
   * `voltageV` above the rail (started there) and discharged into the rail by a resistor.
   */
  clamp?: {
    voltageV: number;
    resistanceOhm: number;
    capacitanceF: number;
    /** Where the resistor returns: the rail, or (no clamp power) a source Vc above it. */
    isHeld: boolean;
  };
}

/** The primary's lines and the nodes the netlist measures and couples the secondaries to. */
export interface DoubleEndedPrimary {
  lines: string[];
  /** The reference winding (the one with Lm across it): dot node, other node. */
  reference: readonly [string, string];
  /** Current sense of the first switch (the one driven in the first half-period). */
  firstSwitchSense: string;
  /** Voltage expressions across the switches of the first leg (or both push-pull switches). */
  switchVoltages: readonly string[];
}

const SWITCH_SERIES_CAPACITANCE_OHM = 1;
/** The resistor across the leakage, over √(Llk/Coss), where not given otherwise. */
const DEFAULT_LEAKAGE_DAMPING_RATIO = 3;

/**
 * Returns the primary lines: the input, the switches (ideal switches with a body diode and a
 * drain capacitance in series with 1 Ω inside each current sense), the winding resistance,
 * leakage (damped by a resistor across it) and the magnetizing inductance across the reference
 * winding; gates `ga` (first half) and `gb` (second half). Push-pull: the second half-winding is
 * an E/F pair on the first, and with `clamp` an RCD clamp from both drains. Half bridge: a capacitor divider holds the winding's far end.
 */
export function doubleEndedPrimaryLines(v: DoubleEndedPrimaryValues): DoubleEndedPrimary {
  // Each drain capacitance starts at the voltage its switch has as the first half begins.
  const sw = (
    name: string,
    top: string,
    bottom: string,
    gate: string,
    sense: boolean,
    startV: number,
  ) => {
    const node = sense ? `${name}s` : top;
    return [
      ...(sense ? [`V${name} ${top} ${node} DC 0`] : []),
      `S${name} ${node} ${bottom} ${gate} 0 primary_switch`,
      `D${name} ${bottom} ${node} body`,
      `C${name} ${node} c${name} ${n(v.drainCapacitanceF)} IC=${n(startV)}`,
      `R${name}c c${name} ${bottom} ${n(SWITCH_SERIES_CAPACITANCE_OHM)}`,
    ];
  };
  // Across each leakage a resistor of 3 times its ring's impedance with the drain capacitance
  // (the push-pull with its clamp: the engine's own `LEAKAGE_DAMPING_RATIO`, 10 times,
  // `doubleEndedNetlist`, since the off drain's rings are in the engine; DEVELOPERS.md, "The
  // push-pull's turn-on ring" and "The push-pull's short dead time").
  const dampingRatio = v.leakageDampingRatio ?? DEFAULT_LEAKAGE_DAMPING_RATIO;
  const series = (name: string, from: string, to: string) => {
    const lines = [
      v.primaryOhm > 0
        ? `Rp${name} ${from} x${name} ${n(v.primaryOhm)}`
        : `Vp${name} ${from} x${name} DC 0`,
    ];
    const leakageH = v.leakageInductanceH;
    if (leakageH > 0) {
      lines.push(
        `Llk${name} x${name} ${to} ${n(leakageH)} IC=0`,
        `Rlk${name} x${name} ${to} ${n(dampingRatio * Math.sqrt(leakageH / Math.max(v.drainCapacitanceF, 1e-12)))}`,
      );
    } else {
      lines.push(`Vlk${name} x${name} ${to} DC 0`);
    }
    return lines;
  };
  const lm = (dot: string, undot: string) => [
    `Vmag ${dot} m DC 0`,
    `Lm m ${undot} ${n(v.magnetizingInductanceH)} IC=${n(v.magnetizingStartA)}`,
  ];
  const vin = n(v.inputVoltageV);
  if (v.kind === 'push-pull') {
    // The center tap at the input; half a: rail -> ta (dot) -> da; half b: rail -> tb -> db,
    // wound so that db rises to Vin + e while da is pulled low.
    return {
      lines: [
        `Vin rail 0 DC ${vin}`,
        ...series('a', 'rail', 'ta'),
        ...lm('ta', 'da'),
        ...series('b', 'rail', 'tb'),
        'Eb tb eb ta da -1',
        'Vbw eb db DC 0',
        'Fb ta da Vbw 1',
        ...sw('qa', 'da', '0', 'ga', true, 0),
        ...sw('qb', 'db', '0', 'gb', false, 2 * v.inputVoltageV),
        ...(v.clamp === undefined
          ? []
          : [
              'Dcla da clamp knee',
              'Dclb db clamp knee',
              `Cclamp clamp rail ${n(v.clamp.capacitanceF)} IC=${n(v.clamp.voltageV)}`,
              ...(v.clamp.isHeld
                ? [
                    `Rclamp clamp held ${n(v.clamp.resistanceOhm)}`,
                    `Vclamp held rail DC ${n(v.clamp.voltageV)}`,
                  ]
                : [`Rclamp clamp rail ${n(v.clamp.resistanceOhm)}`]),
            ]),
      ],
      reference: ['ta', 'da'],
      firstSwitchSense: 'vqa',
      switchVoltages: ['v(da)', 'v(db)'],
    };
  }
  if (v.kind === 'half-bridge') {
    const half = n(v.inputVoltageV / 2);
    return {
      lines: [
        `Vin rail 0 DC ${vin}`,
        ...sw('qh', 'rail', 'sw', 'ga', true, 0),
        ...sw('ql', 'sw', '0', 'gb', false, v.inputVoltageV),
        `Cdiv1 rail mid ${n(v.dividerCapacitanceF)} IC=${half}`,
        `Cdiv2 mid 0 ${n(v.dividerCapacitanceF)} IC=${half}`,
        ...series('a', 'sw', 'p'),
        ...lm('p', 'mid'),
      ],
      reference: ['p', 'mid'],
      firstSwitchSense: 'vqh',
      switchVoltages: ["par('v(rail)-v(sw)')", 'v(sw)'],
    };
  }
  return {
    lines: [
      `Vin rail 0 DC ${vin}`,
      ...sw('qah', 'rail', 'la', 'ga', true, 0),
      ...sw('qbl', 'lb', '0', 'ga', false, 0),
      ...sw('qbh', 'rail', 'lb', 'gb', false, v.inputVoltageV),
      ...sw('qal', 'la', '0', 'gb', false, v.inputVoltageV),
      ...series('a', 'la', 'p'),
      ...lm('p', 'lb'),
    ],
    reference: ['p', 'lb'],
    firstSwitchSense: 'vqah',
    switchVoltages: ["par('v(rail)-v(la)')", 'v(la)'],
  };
}
