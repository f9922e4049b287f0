import { exactValue } from './exact-sum.js';
import { histogramPercentile } from './deviation-histogram.js';
import type { ToleranceChunkOutput } from './tolerance-chunk.js';
import type { ToleranceResult, YieldFigure } from './tolerance-result-schema.js';
import type { ToleranceRun } from './tolerance-run.js';
import type { WorstCaseAnalysis } from './worst-case.js';

/** The caution every tolerance result carries. */
export const TOLERANCE_CAUTION =
  'Computed estimate from a steady-state model with assumed spreads; it does not replace measurement of built units, and offline converters can kill: insulation, creepage, clearance and the applicable safety standards (for example IEC 62368-1) decide, not this result.';

/** What the model holds fixed and leaves out, stated with every result. */
export const TOLERANCE_MODEL_NOTES = [
  'The nominal design is made once; every sample solves that frozen design (turns, transformer build, Lm before its spread, clamp voltage, output inductances and their wound builds, clamp capacitance) with its own part values, at its own operating point: a built unit does not re-choose its turns.',
  "A sample is one unit at one operating point: the input voltage and the load are drawn like the parts, so a yield is the fraction of units × operating conditions in spec. Fix inputVoltageV and loadFraction ('fixed') to ask about one condition.",
  'The regulated output follows its set point (the regulationSetpoint parameter); the controller is otherwise ideal. The flyback clamp is held at its designed voltage (the engine models the clamp as a voltage); a real RCD clamp rises with the leakage energy.',
  "On-resistances are taken as given (the spec's, at operating temperature): the ambient moves the transformer's and output inductors' temperatures and winding resistances only.",
  'Every quantity of the output voltage band is steady state: no load-step or start-up transients.',
];

const Z_95 = 1.959963984540054;

function yieldFigure(passCount: number, count: number): YieldFigure {
  if (count === 0) return { passCount, count, fraction: 0, interval95: [0, 1] };
  const p = passCount / count;
  const z2 = Z_95 * Z_95;
  const centre = (p + z2 / (2 * count)) / (1 + z2 / count);
  const half =
    (Z_95 * Math.sqrt((p * (1 - p)) / count + z2 / (4 * count * count))) / (1 + z2 / count);
  return {
    passCount,
    count,
    fraction: p,
    interval95: [Math.max(0, centre - half), Math.min(1, centre + half)],
  };
}

/** Builds the result from the merged chunk outputs and the worst-case analysis. */
export function toleranceResult(
  run: ToleranceRun,
  merged: ToleranceChunkOutput,
  worstCase: WorstCaseAnalysis,
): ToleranceResult {
  const { parameters, limits, request, frozen } = run;
  const n = merged.solvedCount;
  const sx = merged.parameterSums.map(exactValue);
  const sxx = merged.parameterSquareSums.map(exactValue);
  const total = merged.sampleCount;
  const allMean = merged.allParameterSums.map((sum) => exactValue(sum) / Math.max(total, 1));
  const allDeviation = merged.allParameterSquareSums.map((sum, j) => {
    const mean = allMean[j] as number;
    return total > 1
      ? Math.sqrt(Math.max(0, (exactValue(sum) - total * mean * mean) / (total - 1)))
      : 0;
  });
  const nominalQuantities = limits.map((limit) => limit.read(run.nominal));
  const perLimit = limits.map((limit, l) => {
    const entry = merged.limits[l];
    if (entry === undefined) throw new Error(`toleranceResult: no merged limit ${limit.id}`);
    const count = limit.id === 'regulation' ? merged.sampleCount : n;
    return {
      limit: limit.id,
      ...yieldFigure(count - entry.failCount, count),
      failCount: entry.failCount,
      firstFailures: entry.firstFailures,
    };
  });
  const distributions = limits.map((limit, l) => {
    const entry = merged.limits[l];
    if (entry === undefined || n === 0 || entry.min === undefined || entry.max === undefined) {
      return { quantity: limit.quantity, limit: limit.id, count: 0 };
    }
    const y0 = nominalQuantities[l] as number;
    const sy = exactValue(entry.sum);
    const syy = exactValue(entry.squareSum);
    const meanDeviation = sy / n;
    const variance = n > 1 ? Math.max(0, (syy - n * meanDeviation * meanDeviation) / (n - 1)) : 0;
    const p1 = histogramPercentile(entry.histogram, 0.01, y0, entry.min.value, entry.max.value);
    const p99 = histogramPercentile(entry.histogram, 0.99, y0, entry.min.value, entry.max.value);
    return {
      quantity: limit.quantity,
      limit: limit.id,
      count: n,
      mean: y0 + meanDeviation,
      standardDeviation: Math.sqrt(variance),
      min: entry.min,
      max: entry.max,
      ...(p1 === undefined ? {} : { p1 }),
      ...(p99 === undefined ? {} : { p99 }),
    };
  });
  const sensitivity = limits.map((limit, l) => {
    const entry = merged.limits[l];
    const sy = entry === undefined ? 0 : exactValue(entry.sum);
    const syy = entry === undefined ? 0 : exactValue(entry.squareSum);
    const ranking = parameters.flatMap((parameter, j) => {
      if (!parameter.isVaried) return [];
      const sxy = entry === undefined ? 0 : exactValue(entry.crossSums[j] ?? []);
      const covariance = n * sxy - (sx[j] as number) * sy;
      const spreadX = n * (sxx[j] as number) - (sx[j] as number) ** 2;
      const spreadY = n * syy - sy * sy;
      const correlation =
        n > 1 && spreadX > 0 && spreadY > 0 ? covariance / Math.sqrt(spreadX * spreadY) : undefined;
      const swing = worstCase.oneAtATime.swings[l]?.[j];
      const failCount = entry?.failCount ?? 0;
      const spread = allDeviation[j] as number;
      const failureShift =
        failCount > 0 && spread > 0
          ? (exactValue(entry?.failingParameterSums[j] ?? []) / failCount -
              (allMean[j] as number)) /
            spread
          : undefined;
      return [
        {
          parameter: parameter.id,
          ...(correlation === undefined ? {} : { correlation }),
          ...(swing === undefined ? {} : { oneAtATimeSwing: swing }),
          ...(failureShift === undefined ? {} : { failureShift }),
        },
      ];
    });
    // Largest |correlation| first; parameters without one after, by |swing|; then spec order.
    const order = ranking
      .map((row, index) => ({ row, index }))
      .sort(
        (a, b) =>
          Math.abs(b.row.correlation ?? -1) - Math.abs(a.row.correlation ?? -1) ||
          Math.abs(b.row.oneAtATimeSwing ?? 0) - Math.abs(a.row.oneAtATimeSwing ?? 0) ||
          a.index - b.index,
      )
      .map(({ row }) => row);
    return { limit: limit.id, ranking: order };
  });
  return {
    feasible: true,
    seed: request.seed,
    sampleCount: request.sampleCount,
    topology: frozen.topology.id,
    parameters: parameters.map((p) => ({
      id: p.id,
      label: p.label,
      unit: p.unit,
      nominal: p.nominal,
      distribution: p.distribution,
      origin: p.origin,
      ...(p.origin === 'default' ? { defaultBasis: p.defaultBasis } : {}),
      lower: p.lower,
      upper: p.upper,
    })),
    limits: limits.map((limit, l) => ({
      id: limit.id,
      quantity: limit.quantity,
      description: limit.description,
      sense: limit.sense,
      limit: limit.limit,
      nominalValue: nominalQuantities[l] as number,
    })),
    yield: {
      overall: yieldFigure(merged.passCount, merged.sampleCount),
      perLimit,
      unsolvedByIssueCode: merged.unsolvedByIssueCode,
    },
    worstCase: {
      method: worstCase.method,
      variedParameterCount: worstCase.variedParameterCount,
      evaluationCount: worstCase.evaluationCount,
      perLimit: worstCase.limits.map((row, l) => {
        const limit = limits[l];
        const entry = merged.limits[l];
        const extreme = limit?.sense === 'at-least' ? entry?.min?.value : entry?.max?.value;
        return {
          ...row,
          agreesWithMonteCarlo: row.violates || (entry?.failCount ?? 0) === 0,
          ...(extreme === undefined ? {} : { monteCarloExtreme: extreme }),
        };
      }),
    },
    sensitivity: {
      method:
        'Pearson correlation of each parameter with the limit’s checked quantity over the solved Monte Carlo samples, ranked by its magnitude; beside it the one-at-a-time swing (the quantity at the parameter’s upper band end less at its lower end, every other parameter nominal) and, when the limit has failures, the failure shift (the parameter’s mean over the failing samples less its mean over all samples, in its standard deviations)',
      perLimit: sensitivity,
    },
    distributions,
    nominalDesign: {
      turnsRatio: frozen.choices.turnsRatio,
      outputTurnsRatios: [...frozen.choices.outputTurnsRatios],
      magnetizingInductanceH: frozen.choices.magnetizingInductanceH,
      leakageInductanceH: frozen.choices.leakageInductanceH,
      hasDesignedTransformer: frozen.transformer !== undefined,
    },
    modelNotes: TOLERANCE_MODEL_NOTES,
    caution: TOLERANCE_CAUTION,
  };
}
