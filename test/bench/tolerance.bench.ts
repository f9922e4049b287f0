import {
  TOLERANCE_CHUNK_SIZE,
  TOLERANCE_COMPUTATION,
  evenChunks,
  runChunkToEnd,
  type Spec,
} from '../../solvers/index.js';
import { telecomSpec } from '../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../helpers/forward-specs.js';
import { withMagneticsMode } from './design.bench.js';

/**
 * The specs the Monte Carlo benchmark runs: the invented 36–72 V telecom-style flyback and
 * two-switch forward of the helpers (not any product), each with its transformer designed (every
 * sample re-evaluates it) and assumed (the converter alone).
 */
export const TOLERANCE_BENCH_SPECS: Record<string, Spec> = {
  'flyback (with transformer)': withMagneticsMode(telecomSpec(), 'design'),
  'flyback (converter)': withMagneticsMode(telecomSpec(), 'assume'),
  'two-switch forward (with transformer)': withMagneticsMode(forwardTelecomSpec(), 'design'),
  'two-switch forward (converter)': withMagneticsMode(forwardTelecomSpec(), 'assume'),
};

/** Monte Carlo throughput of one spec in this process. */
export interface ToleranceBenchFigures {
  label: string;
  sampleCount: number;
  /** Samples per second of wall time over whole chunks (each re-makes the nominal design). */
  samplesPerSecond: number;
  /** Samples per second of the process's CPU time for the same chunks. */
  samplesPerCpuSecond: number;
  /** Wall time of the reducer (merge plus the worst-case analysis), s. */
  reduceS: number;
  /** Unit evaluations the worst-case analysis made. */
  worstCaseEvaluations: number;
}

/**
 * Runs `sampleCount` Monte Carlo samples of `spec` (default tolerances) as the job's own chunks,
 * one after another in this process, after one warm-up chunk, and times them and the reducer.
 */
export function benchTolerance(
  label: string,
  spec: Spec,
  options: { sampleCount?: number } = {},
): ToleranceBenchFigures {
  const sampleCount = options.sampleCount ?? 2000;
  const request = TOLERANCE_COMPUTATION.requestSchema.parse({ spec, sampleCount, seed: 1 });
  const warmUp = evenChunks(Math.min(sampleCount, 50), 50).chunks[0];
  if (warmUp !== undefined) runChunkToEnd(TOLERANCE_COMPUTATION.runChunk(request, warmUp));
  const plan = evenChunks(sampleCount, TOLERANCE_CHUNK_SIZE);
  const cpuStart = process.cpuUsage();
  const start = process.hrtime.bigint();
  const outputs = plan.chunks.map((chunk) =>
    runChunkToEnd(TOLERANCE_COMPUTATION.runChunk(request, chunk)),
  );
  const wallS = Number(process.hrtime.bigint() - start) * 1e-9;
  const cpu = process.cpuUsage(cpuStart);
  const reduceStart = process.hrtime.bigint();
  const result = TOLERANCE_COMPUTATION.reduce(request, outputs);
  const reduceS = Number(process.hrtime.bigint() - reduceStart) * 1e-9;
  if (!result.feasible) {
    throw new Error(
      `tolerance bench spec ${label} is infeasible: ${JSON.stringify(result.issues)}`,
    );
  }
  return {
    label: `${label} Monte Carlo, ${sampleCount} samples`,
    sampleCount,
    samplesPerSecond: sampleCount / wallS,
    samplesPerCpuSecond: sampleCount / ((cpu.user + cpu.system) * 1e-6),
    reduceS,
    worstCaseEvaluations: result.worstCase.evaluationCount,
  };
}
