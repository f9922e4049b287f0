import type { MaterialClass } from '../magnetics/material-class.js';
import type { Issue } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import { solveEveryCorner, type SolvedSpec } from '../design/transformer-pass.js';
import { operatingCorners } from '../design/operating-corners.js';
import { failure, success, type Result } from '../result.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import { average } from '../waveform/average.js';
import { minimum } from '../waveform/minimum.js';
import { peak } from '../waveform/peak.js';
import { rms } from '../waveform/rms.js';
import { currentSpectrum } from '../magnetics/winding-ac-resistance.js';
import { BOUND_HARMONIC_COUNT, unitCoreLossDensity } from './candidate-bounds.js';
import type { FrequencySpace } from './search-space.js';
import { fluxLinkageWb } from './search-space.js';

/**
 * The converter solved with the spec's own transformer block and a candidate's magnetizing
 * inductance: what `designConverter` solves first, before it designs the transformer. It does not
 * depend on the core, material, turns (beyond Lm), wires or arrangement, so every candidate with
 * the same frequency and Lm shares it. With what the bounds read off it.
 */
export type FirstPass =
  | { ok: false; issues: Issue[] }
  | {
      ok: true;
      /**
       * The spec solved (Lm fixed for a gapped core, the whole-turns ratios fixed); a candidate's
       * spec adds its magnetics block.
       */
      spec: Spec;
      solved: SolvedSpec;
      duty: TransformerDuty;
      /** Ideal Nk/Np of every winding. */
      idealRatios: number[];
      /** Largest Lm·|im| over the corners, Wb (B = it/(Np·A)). */
      fluxLinkageWb: number;
      /** Largest Lm·|im| at each corner, Wb. */
      cornerFluxLinkagesWb: number[];
      /**
       * Each corner's loss outside the transformer, W: the total less the windings' copper lines
       * (which the spec's assumed resistances set) and every line of a clamp (whose leakage energy
       * or reset current the assumed leakage and Lm set).
       */
      restLossW: number[];
      /** Each corner's leakage-energy loss (lines of mechanism 'clamp', ∝ leakage), W. */
      leakageLossW: number[];
      /** The leakage inductance the first pass was solved with, H. */
      leakageInductanceH: number;
      /** Each winding's RMS current squared at each corner, A² ([winding][corner]). */
      currentRmsSquaredA2: number[][];
      /** Each winding's mean current squared at each corner, A² ([winding][corner]). */
      currentDcSquaredA2: number[][];
      /**
       * Each winding's harmonics 1…{@link BOUND_HARMONIC_COUNT} at each corner, I_n,rms², A²
       * ([winding][corner][n − 1]), as the transformer evaluation's spectrum has them.
       */
      harmonicSquaresA2: number[][][];
      /**
       * What of each winding's AC mean square those harmonics leave (≥ 0), A² ([winding][corner]):
       * the higher harmonics' share (Parseval).
       */
      unsummedAcSquaresA2: number[][];
      /** {@link unitCoreLossDensity} at each corner, by material id (filled on demand). */
      unitCoreLoss: Map<string, number[]>;
    };

/**
 * Winding resistances at 20 °C a first pass may fix (at the ambient then), Ω, with the leakage
 * it takes when the spec fixes none, H.
 */
export interface WindingResistances {
  leakageH: number;
  primaryAt20COhm: number;
  /** One per output (its first winding's). */
  outputsAt20COhm: number[];
}

/** A first pass that solved. */
export type SolvedPass = Extract<FirstPass, { ok: true }>;

/**
 * Solves the first pass of `f` with magnetizing inductance `magnetizingInductanceH` (or the
 * spec's) and, when given, the whole-turns ratios Np/Ns of every output (a candidate's spec fixes
 * them, so that the transformer is designed on the operating point its own turns give).
 * With `only` (operating-corner indices, ascending), only those corners are solved and every
 * per-corner list holds those corners only, in that order: each corner is solved on its own from
 * the same spec and choices, as `solveEveryCorner` solves it, so each is that corner of the
 * whole pass to the bit (`partial-bound-pass.test.ts`).
 */
export function firstPass(
  f: FrequencySpace,
  magnetizingInductanceH: number | undefined,
  outputTurnsRatios?: readonly number[],
  resistances?: WindingResistances,
  only?: readonly number[],
): FirstPass {
  const spec: Spec = {
    ...f.spec,
    ...(resistances === undefined
      ? {}
      : {
          outputs: f.spec.outputs.map((output, k) => ({
            ...output,
            windingResistanceOhm: resistances.outputsAt20COhm[k] ?? output.windingResistanceOhm,
          })),
        }),
    transformer: {
      ...f.spec.transformer,
      ...(resistances === undefined
        ? {}
        : {
            primaryResistanceOhm: resistances.primaryAt20COhm,
            copperTemperatureC: f.spec.ambientTemperatureC,
            leakageInductanceH: f.spec.transformer.leakageInductanceH ?? resistances.leakageH,
          }),
      ...(magnetizingInductanceH === undefined ? {} : { magnetizingInductanceH }),
      ...(outputTurnsRatios === undefined
        ? {}
        : {
            turnsRatio: outputTurnsRatios[0] as number,
            outputTurnsRatios: [...outputTurnsRatios],
          }),
    },
  };
  const solved = only === undefined ? solveEveryCorner(f.topology, spec) : solveAt(f, spec, only);
  if (!solved.ok) return { ok: false, issues: solved.issues };
  const dutyOf = f.topology.transformerDuty;
  if (dutyOf === undefined) throw new Error('firstPass: topology has no transformer duty');
  const solvedDuty = dutyOf(spec, solved.value.choices, solved.value.corners);
  // As fixTransformer: a magnetizing inductance the spec fixes is met by a gap.
  const duty: TransformerDuty =
    spec.transformer.magnetizingInductanceH === undefined
      ? solvedDuty
      : { ...solvedDuty, gapRole: 'set-inductance' };
  const windingNames = new Set(duty.windings.map((winding) => winding.name));
  const restLossW = solved.value.corners.map((corner) => {
    let rest = corner.lossTotalW;
    for (const line of corner.losses) {
      const isWinding = line.mechanism === 'copper' && windingNames.has(line.component);
      const isClamp = line.mechanism === 'clamp' || line.component.includes('clamp');
      if (isWinding || isClamp) rest -= line.powerW;
    }
    return Math.max(0, rest);
  });
  const leakageLossW = solved.value.corners.map((corner) =>
    corner.losses.reduce((sum, line) => (line.mechanism === 'clamp' ? sum + line.powerW : sum), 0),
  );
  const { leakageInductanceH } = solved.value.choices as { leakageInductanceH: number };
  const spectra = duty.windings.map((winding) =>
    winding.currentsA.map((current) => currentSpectrum(current, BOUND_HARMONIC_COUNT)),
  );
  return {
    ok: true,
    spec,
    solved: solved.value,
    duty,
    idealRatios: duty.windings.map((winding) => winding.turnsPerPrimaryTurn),
    fluxLinkageWb: fluxLinkageWb(duty),
    cornerFluxLinkagesWb: duty.magnetizingCurrentsA.map(
      (current) => duty.magnetizingInductanceH * Math.max(peak(current), -minimum(current)),
    ),
    restLossW,
    leakageLossW,
    leakageInductanceH,
    currentRmsSquaredA2: duty.windings.map((winding) =>
      winding.currentsA.map((current) => rms(current) ** 2),
    ),
    currentDcSquaredA2: duty.windings.map((winding) =>
      winding.currentsA.map((current) => average(current) ** 2),
    ),
    harmonicSquaresA2: spectra.map((corners) =>
      corners.map((spectrum) => [...spectrum.harmonicSquaresA2]),
    ),
    unsummedAcSquaresA2: spectra.map((corners) =>
      corners.map((spectrum) => {
        let summedA2 = 0;
        for (const squareA2 of spectrum.harmonicSquaresA2) summedA2 += squareA2;
        return Math.max(0, spectrum.acSquareA2 - summedA2);
      }),
    ),
    unitCoreLoss: new Map(),
  };
}

/** `solveEveryCorner` at the operating corners `only` (indices) of `spec`. */
function solveAt(f: FrequencySpace, spec: Spec, only: readonly number[]): Result<SolvedSpec> {
  const chosen = f.topology.choose(spec);
  if (!chosen.ok) return chosen;
  const all = operatingCorners(spec);
  const corners: SolvedSpec['corners'] = [];
  const issues: Issue[] = [];
  for (const c of only) {
    const solved = f.topology.solveCorner(spec, chosen.value, all[c]!);
    if (solved.ok) corners.push(solved.value);
    else issues.push(...solved.issues);
  }
  return issues.length > 0 ? failure(issues) : success({ choices: chosen.value, corners });
}

/** The per-corner unit core-loss densities of `material` on a first pass (cached on it). */
export function unitCoreLossOf(
  pass: Extract<FirstPass, { ok: true }>,
  material: MaterialClass,
): number[] {
  const known = pass.unitCoreLoss.get(material.id);
  if (known !== undefined) return known;
  const densities = pass.duty.magnetizingCurrentsA.map((current) =>
    unitCoreLossDensity(current, pass.duty.magnetizingInductanceH, material),
  );
  pass.unitCoreLoss.set(material.id, densities);
  return densities;
}

/**
 * The whole-turns ratio Np/Ns of every output of `turns` (the first winding of each output names
 * it, as the design does when it fixes a transformer into the spec); undefined when an output has
 * no winding.
 */
export function outputTurnsRatiosOf(
  pass: Extract<FirstPass, { ok: true }>,
  turns: readonly number[],
  outputCount: number,
): number[] | undefined {
  const ratios: number[] = new Array<number>(outputCount).fill(NaN);
  pass.duty.windings.forEach((winding, k) => {
    if (winding.role.kind !== 'output') return;
    const index = winding.role.outputIndex;
    if (Number.isNaN(ratios[index])) ratios[index] = (turns[0] as number) / (turns[k] as number);
  });
  return ratios.every((ratio) => Number.isFinite(ratio)) ? ratios : undefined;
}
