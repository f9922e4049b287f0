import type { CsvTable } from '../jobs/chunked-computation.js';
import type { WindingWire } from '../transformer/winding-wire.js';
import type { CoreSearchCandidate, CoreSearchResult } from './core-search-candidate.js';

/**
 * The CSV columns of a core search, in order: where the candidate stands (its rank by loss,
 * whether it is on the Pareto front), its build, then its figures. Names carry their unit
 * suffixes as in the JSON; per-winding lists are joined by ';' in the order of `windingNames`.
 */
export const CORE_SEARCH_CSV_COLUMNS = [
  'topRank',
  'onParetoFront',
  'index',
  'frequencyHz',
  'coreShape',
  'materialId',
  'arrangement',
  'windingNames',
  'turns',
  'wires',
  'gapLengthM',
  'magnetizingInductanceH',
  'leakageInductanceH',
  'lossWorstCornerW',
  'lossNominalW',
  'transformerLossWorstCornerW',
  'efficiencyNominal',
  'temperatureRiseK',
  'fluxDensityUtilization',
  'windowFill',
  'coreVolumeM3',
] as const;

/**
 * A wire in a few characters: 'round AWG 24 x2' (two in parallel), 'litz 120 x AWG 40' or
 * 'foil 0.2 mm' (its thickness).
 */
export function wireLabel(wire: WindingWire): string {
  if (wire.kind === 'foil') return `foil ${+(wire.thicknessM * 1e3).toPrecision(6)} mm`;
  return wire.kind === 'round'
    ? `round AWG ${wire.awg} x${wire.parallelCount}`
    : `litz ${wire.strandCount} x AWG ${wire.strandAwg}`;
}

function csvRow(
  candidate: CoreSearchCandidate,
  topRank: number | undefined,
  onParetoFront: boolean,
): CsvTable['rows'][number] {
  return [
    topRank ?? null,
    onParetoFront,
    candidate.index,
    candidate.frequencyHz,
    candidate.coreShape,
    candidate.materialId,
    candidate.arrangement,
    candidate.windingNames.join(';'),
    candidate.turns.join(';'),
    candidate.wires.map(wireLabel).join(';'),
    candidate.gapLengthM,
    candidate.magnetizingInductanceH,
    candidate.leakageInductanceH,
    candidate.lossWorstCornerW,
    candidate.lossNominalW,
    candidate.transformerLossWorstCornerW,
    candidate.efficiencyNominal,
    candidate.temperatureRiseK,
    candidate.fluxDensityUtilization,
    candidate.windowFill,
    candidate.coreVolumeM3,
  ];
}

/**
 * A core search's result as one table: one row per returned candidate, the top N first in rank
 * order (`topRank` 1…N), then the Pareto members outside the top N in front order (`topRank`
 * empty). A candidate in both appears once. The counts and the specs stay in the JSON.
 */
export function coreSearchCsvTable(result: CoreSearchResult): CsvTable {
  const onFront = new Set(result.paretoFront.map((candidate) => candidate.index));
  const inTop = new Set(result.top.map((candidate) => candidate.index));
  const rows = [
    ...result.top.map((candidate, rank) =>
      csvRow(candidate, rank + 1, onFront.has(candidate.index)),
    ),
    ...result.paretoFront
      .filter((candidate) => !inTop.has(candidate.index))
      .map((candidate) => csvRow(candidate, undefined, true)),
  ];
  return { columns: [...CORE_SEARCH_CSV_COLUMNS], rows };
}
