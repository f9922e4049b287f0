import type { ChunkPlan } from '../jobs/chunked-computation.js';
import { addExact, mergeExact, type ExactSum } from './exact-sum.js';
import { addToHistogram, mergeHistograms, type DeviationHistogram } from './deviation-histogram.js';
import { keepsLimit, type LimitId } from './tolerance-limits.js';
import type { FailingSample } from './tolerance-result-schema.js';
import { evaluateUnit, sampleValues, type ToleranceRun } from './tolerance-run.js';

/** Failing samples kept per limit (the first by sample index), with their parameter values. */
export const FAILING_SAMPLES_KEPT = 3;

/** A quantity's extreme and the first sample that reached it. */
export interface Extreme {
  value: number;
  sample: number;
}

/**
 * What one chunk returns: counts and exact sums only (plain JSON), so that merging chunk outputs
 * in chunk order gives the same numbers however the samples were cut. Sums run over the solved
 * samples of the chunk; parameter and quantity values enter as deviations from the nominal.
 */
export interface ToleranceChunkOutput {
  /** Samples in the chunk. */
  sampleCount: number;
  /** Samples that kept every limit. */
  passCount: number;
  /** Samples the engine could not solve, by issue code (each code counted once per sample). */
  unsolvedByIssueCode: Record<string, number>;
  /** Solved samples: the count every sum below runs over. */
  solvedCount: number;
  /** Σ(x − x0) and Σ(x − x0)² of each parameter (parameter order). */
  parameterSums: ExactSum[];
  parameterSquareSums: ExactSum[];
  /** The same over every sample of the chunk, solved or not. */
  allParameterSums: ExactSum[];
  allParameterSquareSums: ExactSum[];
  /** Per limit (id order of the run's limits). */
  limits: LimitChunkOutput[];
}

/** One limit within a chunk. */
export interface LimitChunkOutput {
  id: LimitId;
  /** Samples that fail this limit (regulation: the unsolved; others: solved and outside). */
  failCount: number;
  firstFailures: FailingSample[];
  /** Σ(x − x0) of each parameter over the samples failing this limit. */
  failingParameterSums: ExactSum[];
  /** Σ(y − y0), Σ(y − y0)² of the checked quantity, and Σ(x − x0)(y − y0) per parameter. */
  sum: ExactSum;
  squareSum: ExactSum;
  crossSums: ExactSum[];
  min?: Extreme;
  max?: Extreme;
  histogram: DeviationHistogram;
}

/** An empty chunk output for a run's parameters and limits. */
export function emptyChunkOutput(run: ToleranceRun): ToleranceChunkOutput {
  return {
    sampleCount: 0,
    passCount: 0,
    unsolvedByIssueCode: {},
    solvedCount: 0,
    parameterSums: run.parameters.map(() => []),
    parameterSquareSums: run.parameters.map(() => []),
    allParameterSums: run.parameters.map(() => []),
    allParameterSquareSums: run.parameters.map(() => []),
    limits: run.limits.map((limit) => ({
      id: limit.id,
      failCount: 0,
      firstFailures: [],
      failingParameterSums: run.parameters.map(() => []),
      sum: [],
      squareSum: [],
      crossSums: run.parameters.map(() => []),
      histogram: {},
    })),
  };
}

/**
 * Computes the samples of one chunk, yielding the number done after each sample. Each sample's
 * values come from its own random streams, so the output depends on the chunk's range only.
 */
export function* runToleranceChunk(
  run: ToleranceRun,
  chunk: ChunkPlan,
): Generator<number, ToleranceChunkOutput, void> {
  const output = emptyChunkOutput(run);
  const nominalValues = run.parameters.map((p) => p.nominal);
  const nominalQuantities = run.limits.map((limit) => limit.read(run.nominal));
  for (let i = 0; i < chunk.count; i++) {
    const sample = chunk.start + i;
    const values = sampleValues(run, sample);
    const outcome = evaluateUnit(run.frozen, run.parameters, values);
    output.sampleCount += 1;
    const parametersOf = () =>
      Object.fromEntries(run.parameters.map((p, j) => [p.id, values[j] as number]));
    const deviations = values.map((value, j) => value - (nominalValues[j] as number));
    deviations.forEach((x, j) => {
      addExact(output.allParameterSums[j] as ExactSum, x);
      addExact(output.allParameterSquareSums[j] as ExactSum, x * x);
    });
    const countFailing = (entry: LimitChunkOutput) =>
      deviations.forEach((x, j) => addExact(entry.failingParameterSums[j] as ExactSum, x));
    if (!outcome.solved) {
      const codes = [...new Set(outcome.issues.map((issue) => issue.code))].sort();
      for (const code of codes) {
        output.unsolvedByIssueCode[code] = (output.unsolvedByIssueCode[code] ?? 0) + 1;
      }
      // An unsolved unit fails regulation; its other quantities do not exist.
      const regulation = output.limits.find((l) => l.id === 'regulation');
      if (regulation !== undefined) {
        regulation.failCount += 1;
        countFailing(regulation);
        if (regulation.firstFailures.length < FAILING_SAMPLES_KEPT) {
          regulation.firstFailures.push({ sample, parameters: parametersOf(), issueCodes: codes });
        }
      }
      yield i + 1;
      continue;
    }
    output.solvedCount += 1;
    deviations.forEach((x, j) => {
      addExact(output.parameterSums[j] as ExactSum, x);
      addExact(output.parameterSquareSums[j] as ExactSum, x * x);
    });
    let isPassing = true;
    run.limits.forEach((limit, l) => {
      const entry = output.limits[l] as LimitChunkOutput;
      const value = limit.read(outcome);
      const y0 = nominalQuantities[l] as number;
      const y = value - y0;
      addExact(entry.sum, y);
      addExact(entry.squareSum, y * y);
      deviations.forEach((x, j) => addExact(entry.crossSums[j] as ExactSum, x * y));
      if (entry.min === undefined || value < entry.min.value) entry.min = { value, sample };
      if (entry.max === undefined || value > entry.max.value) entry.max = { value, sample };
      addToHistogram(entry.histogram, value, y0);
      if (!keepsLimit(limit, value)) {
        isPassing = false;
        entry.failCount += 1;
        countFailing(entry);
        if (entry.firstFailures.length < FAILING_SAMPLES_KEPT) {
          entry.firstFailures.push({ sample, parameters: parametersOf(), value });
        }
      }
    });
    if (isPassing) output.passCount += 1;
    yield i + 1;
  }
  return output;
}

/**
 * Merges chunk outputs handed over in chunk order into one (exact sums, summed counts, the
 * earliest failing samples, extremes with the earliest sample on ties).
 */
export function mergeChunkOutputs(
  run: ToleranceRun,
  outputs: readonly ToleranceChunkOutput[],
): ToleranceChunkOutput {
  const merged = emptyChunkOutput(run);
  for (const output of outputs) {
    merged.sampleCount += output.sampleCount;
    merged.passCount += output.passCount;
    merged.solvedCount += output.solvedCount;
    for (const [code, count] of Object.entries(output.unsolvedByIssueCode)) {
      merged.unsolvedByIssueCode[code] = (merged.unsolvedByIssueCode[code] ?? 0) + count;
    }
    output.parameterSums.forEach((sum, j) => mergeExact(merged.parameterSums[j] as ExactSum, sum));
    output.parameterSquareSums.forEach((sum, j) =>
      mergeExact(merged.parameterSquareSums[j] as ExactSum, sum),
    );
    output.allParameterSums.forEach((sum, j) =>
      mergeExact(merged.allParameterSums[j] as ExactSum, sum),
    );
    output.allParameterSquareSums.forEach((sum, j) =>
      mergeExact(merged.allParameterSquareSums[j] as ExactSum, sum),
    );
    output.limits.forEach((entry, l) => {
      const target = merged.limits[l];
      if (target === undefined || target.id !== entry.id) {
        throw new Error(`mergeChunkOutputs: chunk limit ${entry.id} does not match the run`);
      }
      target.failCount += entry.failCount;
      entry.failingParameterSums.forEach((sum, j) =>
        mergeExact(target.failingParameterSums[j] as ExactSum, sum),
      );
      for (const failing of entry.firstFailures) {
        if (target.firstFailures.length < FAILING_SAMPLES_KEPT) target.firstFailures.push(failing);
      }
      mergeExact(target.sum, entry.sum);
      mergeExact(target.squareSum, entry.squareSum);
      entry.crossSums.forEach((sum, j) => mergeExact(target.crossSums[j] as ExactSum, sum));
      if (
        entry.min !== undefined &&
        (target.min === undefined || entry.min.value < target.min.value)
      ) {
        target.min = entry.min;
      }
      if (
        entry.max !== undefined &&
        (target.max === undefined || entry.max.value > target.max.value)
      ) {
        target.max = entry.max;
      }
      mergeHistograms(target.histogram, entry.histogram);
    });
  }
  return merged;
}
