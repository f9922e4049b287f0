import { brentRoot } from '../../root-finding/brent-root.js';

/** A discontinuous output stage as the swing below Vin sees it, primary-referred (SI units). */
export interface RampStage {
  /** n·(Vo + Vf): the winding voltage above which its rectifier conducts, V. */
  thresholdV: number;
  /** n²·L, H. */
  inductanceH: number;
}

/** The winding's rise in the dead time once the drain has passed Vin (SI units). */
export interface LoadedRamp {
  /** ∫ of the winding voltage over the rise, V·s. */
  positiveVoltSecondsVs: number;
  /** Drain voltage as the gate turns on, V (Vin less the winding's). */
  turnOnVoltageV: number;
  /** Time the main switch's body diode holds the winding at Vin, s. */
  bodyDiodeS: number;
  /** Each stage's primary-referred inductor current as the gate turns on, A. */
  stageCurrentsA: number[];
}

const EVENTS_MAX = 64;
/** A threshold within this fraction of Vin of the winding is reached (round-off). */
const LEVEL_TOLERANCE = 1e-12;
/** A conducting stage stops where its current falls below this fraction of the driving current. */
const CURRENT_TOLERANCE = 1e-9;

/**
 * Returns the winding's rise from zero over `restS` once the drain has passed Vin, driven by the
 * unheld current `drivingA` (|ΣIv/n + Im,v| of Lm and the continuous stages, constant over the
 * dead time) into the switch node's capacitance C, loaded by each discontinuous stage once the
 * winding passes its threshold: C·dv/dt = I − Σ ik, nk²·Lk·dik/dt = v − Vk while ik > 0; while
 * the body diode holds the drain at zero the stages see `bodyDiodeWindingV`, the winding's
 * on-voltage (Vin less the on-state's drops: the circuit is the on-state's). With the
 * set of conducting stages fixed the winding is a sinusoid about Veq = Lp·Σ Vk/Lk' at
 * ω = 1/√(Lp·C), Lp the stages' inductances in parallel (the driven LC resonance: Erickson &
 * Maksimović, 2nd ed. (from memory), ch. 19, the resonant tank's state plane); it is solved
 * piecewise between the events: a stage's threshold reached, a stage's current back at zero, the
 * winding at Vin (the body diode holds it there while I > Σ ik), the gate.
 */
export function loadedRamp(
  inputVoltageV: number,
  drivingA: number,
  capacitanceF: number,
  restS: number,
  stages: readonly RampStage[],
  bodyDiodeWindingV: number,
): LoadedRamp {
  const vin = inputVoltageV;
  const c = capacitanceF;
  const currents = stages.map(() => 0);
  const isOn = stages.map(() => false);
  let v = 0;
  let t = 0;
  let areaVs = 0;
  let bodyDiodeS = 0;
  let isClamped = false;
  for (let event = 0; event < EVENTS_MAX && t < restS; event++) {
    const leftS = restS - t;
    let sumA = 0;
    for (let k = 0; k < stages.length; k++) if (isOn[k]) sumA += currents[k] as number;
    if (isClamped) {
      // The body diode holds the drain at zero: the circuit is the on-state's, and the stages
      // ramp at (Vw − Vk)/Lk' (Vw the winding's on-voltage there) until they carry the driving
      // current, and the diode stops.
      const onV = bodyDiodeWindingV;
      let rampAPerS = 0;
      for (let k = 0; k < stages.length; k++) {
        const s = stages[k] as RampStage;
        if (isOn[k]) rampAPerS += (onV - s.thresholdV) / s.inductanceH;
      }
      const stopS = rampAPerS > 0 ? (drivingA - sumA) / rampAPerS : Infinity;
      const segS = Math.min(leftS, Math.max(0, stopS));
      for (let k = 0; k < stages.length; k++) {
        const s = stages[k] as RampStage;
        if (isOn[k])
          currents[k] = (currents[k] as number) + ((onV - s.thresholdV) / s.inductanceH) * segS;
      }
      areaVs += vin * segS;
      bodyDiodeS += segS;
      t += segS;
      isClamped = false;
      continue;
    }
    // The next threshold above the winding among the stages not conducting.
    let nextLevelV = vin;
    let joining = -1;
    for (let k = 0; k < stages.length; k++) {
      const level = (stages[k] as RampStage).thresholdV;
      if (!isOn[k] && level > v + LEVEL_TOLERANCE * vin && level < nextLevelV) {
        nextLevelV = level;
        joining = k;
      } else if (!isOn[k] && level < vin && level <= v + LEVEL_TOLERANCE * vin) {
        // At (or, by round-off, just past) its threshold: it joins now.
        isOn[k] = true;
        joining = -2;
      }
    }
    if (joining === -2) continue;
    let inverseL = 0;
    let weightedV = 0;
    for (let k = 0; k < stages.length; k++) {
      if (!isOn[k]) continue;
      const s = stages[k] as RampStage;
      inverseL += 1 / s.inductanceH;
      weightedV += s.thresholdV / s.inductanceH;
    }
    if (inverseL === 0) {
      // No stage conducts: the drain falls at I/C.
      const slope = drivingA / c;
      const reachS = (nextLevelV - v) / slope;
      const segS = Math.min(leftS, reachS);
      areaVs += v * segS + (slope * segS * segS) / 2;
      v += slope * segS;
      t += segS;
      if (reachS <= leftS) {
        v = nextLevelV;
        if (joining >= 0) isOn[joining] = true;
        else isClamped = true;
      }
      continue;
    }
    const veq = weightedV / inverseL;
    const omega = Math.sqrt(inverseL / c);
    const a = v - veq;
    const b = (drivingA - sumA) / (c * omega);
    let segS = Math.min(leftS, upwardCrossingS(a, b, omega, nextLevelV - veq));
    const reaches = segS < leftS;
    // A conducting stage whose current returns to zero within the segment stops there.
    let stopping = -1;
    const tank: Tank = { veq, a, b, omega };
    for (let k = 0; k < stages.length; k++) {
      if (!isOn[k]) continue;
      const s = stages[k] as RampStage;
      const stopS = stopTimeS(tank, currents[k] as number, s, segS, -CURRENT_TOLERANCE * drivingA);
      if (stopS < segS) {
        segS = stopS;
        stopping = k;
      }
    }
    const areaSegVs = sinusoidIntegral(veq, a, b, omega, segS);
    for (let k = 0; k < stages.length; k++) {
      if (!isOn[k]) continue;
      const s = stages[k] as RampStage;
      currents[k] = (currents[k] as number) + (areaSegVs - s.thresholdV * segS) / s.inductanceH;
    }
    areaVs += areaSegVs;
    v = Math.min(vin, veq + a * Math.cos(omega * segS) + b * Math.sin(omega * segS));
    t += segS;
    if (stopping >= 0) {
      isOn[stopping] = false;
      currents[stopping] = 0;
    } else if (reaches) {
      v = nextLevelV;
      if (joining >= 0) isOn[joining] = true;
      else isClamped = true;
    }
  }
  return {
    positiveVoltSecondsVs: areaVs,
    turnOnVoltageV: vin - v,
    bodyDiodeS,
    stageCurrentsA: currents,
  };
}

/**
 * The first s > 0 at which a·cos(ωs) + b·sin(ωs) rises through `level` (Infinity if never): with
 * a = M·cos φ, b = M·sin φ the sinusoid is M·cos(ωs − φ).
 */
function upwardCrossingS(a: number, b: number, omega: number, level: number): number {
  const m = Math.hypot(a, b);
  if (!(m > Math.abs(level))) return Infinity;
  const phi = Math.atan2(b, a);
  const angle = Math.acos(level / m);
  // Rising through the level where ωs − φ = −angle (mod 2π).
  let x = (phi - angle) % (2 * Math.PI);
  if (x <= 0) x += 2 * Math.PI;
  return x / omega;
}

/** The winding over a segment: v − veq = a·cos(ωs) + b·sin(ωs). */
interface Tank {
  veq: number;
  a: number;
  b: number;
  omega: number;
}

/** ∫₀ˢ v ds over a segment, V·s. */
function sinusoidIntegral(veq: number, a: number, b: number, omega: number, s: number): number {
  return veq * s + (a * Math.sin(omega * s) + b * (1 - Math.cos(omega * s))) / omega;
}

/**
 * A conducting stage's current over a segment, i0 + (∫v − Vk·s)/Lk': a returned arrow, not a
 * named one in the caller (under tsx esbuild's keepNames wraps each named arrow in an
 * Object.defineProperty call, as `stage-inversion.ts` notes).
 */
function stageCurrentOf(tank: Tank, i0: number, stage: RampStage): (s: number) => number {
  return (s) => stageCurrentAt(tank, i0, stage, s);
}

/** A conducting stage's current at s into the segment, A. */
function stageCurrentAt(tank: Tank, i0: number, stage: RampStage, s: number): number {
  return (
    i0 +
    (sinusoidIntegral(tank.veq, tank.a, tank.b, tank.omega, s) - stage.thresholdV * s) /
      stage.inductanceH
  );
}

/**
 * The first s in [0, segS] at which `current` falls to zero (Infinity if none), for a stage whose
 * dik/dt = (v − Vk)/Lk' (`level` = Vk − veq): the current falls only while the winding is below
 * the threshold, from a downward crossing (or the start) to the next upward one (or segS),
 * monotonically, so each such stretch whose end is below `floorA` brackets one root.
 */
function stopTimeS(tank: Tank, i0: number, stage: RampStage, segS: number, floorA: number): number {
  const { a, b, omega } = tank;
  const level = stage.thresholdV - tank.veq;
  const m = Math.hypot(a, b);
  if (!(m > Math.abs(level))) {
    // The winding stays on one side of the threshold over the whole segment.
    return a < level ? rootIn(tank, i0, stage, 0, segS, floorA) : Infinity;
  }
  const phi = Math.atan2(b, a);
  const angle = Math.acos(level / m);
  let up = (phi - angle) % (2 * Math.PI);
  if (up < 0) up += 2 * Math.PI;
  let down = (phi + angle) % (2 * Math.PI);
  if (down <= 0) down += 2 * Math.PI;
  up /= omega;
  down /= omega;
  // Below the threshold at the start (falling current) until the first upward crossing.
  if (up < down && up > 0) {
    const rootS = rootIn(tank, i0, stage, 0, Math.min(up, segS), floorA);
    if (rootS < Infinity) return rootS;
  }
  const fallS = (2 * Math.PI - 2 * angle) / omega;
  for (let start = down; start < segS; start += (2 * Math.PI) / omega) {
    const rootS = rootIn(tank, i0, stage, start, Math.min(start + fallS, segS), floorA);
    if (rootS < Infinity) return rootS;
  }
  return Infinity;
}

/** The zero of a falling `current` in [low, high] if it ends below `floorA`, else Infinity. */
function rootIn(
  tank: Tank,
  i0: number,
  stage: RampStage,
  low: number,
  high: number,
  floorA: number,
): number {
  if (!(stageCurrentAt(tank, i0, stage, high) < floorA)) return Infinity;
  const rootS = brentRoot(stageCurrentOf(tank, i0, stage), low, high, {
    absoluteTolerance: 1e-15,
  });
  return Number.isFinite(rootS) ? rootS : high;
}
