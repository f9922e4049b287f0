/**
 * The engine's only public entry point: plain data in, plain data out, no I/O.
 * api/ and workers/ import from here and nowhere else in solvers/.
 */
export type { Result, Issue, IssueCode } from './result.js';
export { ISSUE_CODES, success, failure } from './result.js';
export { IssueSchema } from './result-schema.js';
export type { Spec, SpecInput, Output, Rectifier } from './spec/spec-schema.js';
export { SpecSchema, TOPOLOGY_IDS } from './spec/spec-schema.js';
export type { MagneticsSpec } from './spec/magnetics-spec-schema.js';
export { InlineMaterialSchema } from './spec/magnetics-spec-schema.js';
export type { HoldUp } from './spec/hold-up-schema.js';
export { checkSpecConsistency } from './spec/spec-consistency.js';
export type {
  Design,
  FlybackDesign,
  ForwardDesign,
  ResetWindingForwardDesign,
  ActiveClampForwardDesign,
  ActiveClampForwardCorner,
  ForwardCorner,
  DoubleEndedDesign,
  DoubleEndedCorner,
  AnyCorner,
  Corner,
  DeviceStress,
  Loss,
  ConductionMode,
} from './design/design-schema.js';
export { DesignSchema, CornerSchema, WaveformSchema } from './design/design-schema.js';
export { designConverter } from './design/design-converter.js';
export type { HoldUpDesign } from './design/hold-up-design-schema.js';
export { holdUpCapacitance } from './design/hold-up-capacitance.js';
export type {
  CompareTopologiesOptions,
  RankedDesign,
  RejectedTopology,
  TopologyComparison,
} from './design/compare-topologies.js';
export { compareTopologies } from './design/compare-topologies.js';
export type { RankingFigure, RankingFigureId, RankingOrder } from './design/ranking-figures.js';
export { RANKING_FIGURE_IDS, RANKING_FIGURES } from './design/ranking-figures.js';
export { assertFiniteNumbers } from './design/assert-finite-numbers.js';
export { operatingCorners } from './design/operating-corners.js';
export { flybackNetlist, type FlybackNetlistOptions } from './netlist/flyback-netlist.js';
export {
  twoSwitchForwardNetlist,
  type TwoSwitchForwardNetlistOptions,
} from './netlist/two-switch-forward-netlist.js';
export {
  activeClampForwardNetlist,
  type ActiveClampForwardNetlistOptions,
} from './netlist/active-clamp-forward-netlist.js';
export {
  doubleEndedNetlist,
  type DoubleEndedNetlistOptions,
} from './netlist/double-ended-netlist.js';
export { designNetlist, type DesignNetlistOptions } from './netlist/design-netlist.js';
export type { Waveform } from './waveform/waveform.js';
export type { OperatingCorner, Topology } from './topologies/topology.js';
export type {
  SweepRequest,
  SweepRequestInput,
  SweepRow,
  SweepResult,
} from './sweeps/sweep-request-schema.js';
export {
  SweepRequestSchema,
  SweepRowSchema,
  SweepResultSchema,
} from './sweeps/sweep-request-schema.js';
export type { SweepPoint, SweepChoiceCache } from './sweeps/parametric.js';
export {
  sweepPoints,
  sweepPointCount,
  sweepPointRange,
  evaluateSweepPoint,
} from './sweeps/parametric.js';
export { sweepComputation } from './sweeps/sweep-computation.js';
export type { ResultMeta } from './versioning/result-meta.js';
export { SOLVER_VERSION, SCHEMA_VERSION, inputHash, resultMeta } from './versioning/result-meta.js';
export { canonicalJson } from './versioning/canonical-json.js';
export { celsiusToKelvin } from './units.js';
export type { CoreShape } from './magnetics/core-shape.js';
export { CORE_SHAPE_CATALOG } from './magnetics/core-shape-catalog.js';
export type { CoreGeometry } from './magnetics/core-geometry.js';
export { coreGeometry } from './magnetics/core-geometry.js';
export type { MaterialClass } from './magnetics/material-class.js';
export { MATERIAL_CLASSES } from './magnetics/material-classes.js';
export type { SteinmetzCoefficients } from './magnetics/steinmetz-coefficients.js';
export type { LossPoint, SteinmetzFit, SteinmetzFitOptions } from './magnetics/steinmetz-fit.js';
export { steinmetzFit } from './magnetics/steinmetz-fit.js';
export {
  CORE_SHAPE_FAMILIES,
  CoreShapeSchema,
  CoreGeometrySchema,
  SteinmetzCoefficientsSchema,
  MaterialClassSchema,
  LossPointSchema,
  SteinmetzFitSchema,
} from './magnetics/catalog-schemas.js';
export { AWG_MIN, AWG_MAX } from './magnetics/round-wire-gauge.js';
export type {
  RoundWireCatalogRow,
  RoundWireCatalogOptions,
} from './magnetics/round-wire-catalog.js';
export { roundWireCatalog, RoundWireCatalogRowSchema } from './magnetics/round-wire-catalog.js';
export type {
  ChunkedComputation,
  ChunkPlan,
  CsvCell,
  CsvTable,
  JobPlan,
} from './jobs/chunked-computation.js';
export type { AnyChunkedComputation, JobKind, JobRequestOf } from './jobs/job-computations.js';
export { JOB_COMPUTATIONS, JOB_KINDS, jobComputation } from './jobs/job-computations.js';
export type { JobResult, JobResultMeta } from './jobs/job-result.js';
export { jobResult } from './jobs/job-result.js';
export { evenChunks, runChunkToEnd } from './jobs/chunked-computation.js';
export {
  TOLERANCE_COMPUTATION,
  TOLERANCE_CHUNK_SIZE,
  type ToleranceChunk,
} from './tolerance/tolerance-computation.js';
export {
  ToleranceRequestSchema,
  TOLERANCE_DEFAULTS,
  TOLERANCE_SAMPLE_COUNT_MAX,
  type ToleranceRequest,
  type ToleranceRequestInput,
} from './tolerance/tolerance-request-schema.js';
export {
  ToleranceResultSchema,
  InfeasibleToleranceResultSchema,
  ToleranceJobResultSchema,
  type ToleranceResult,
  type InfeasibleToleranceResult,
  type YieldFigure,
} from './tolerance/tolerance-result-schema.js';
export { DistributionSchema, type Distribution } from './tolerance/tolerance-distribution.js';
export type {
  CoreSearchRequest,
  CoreSearchRequestInput,
} from './core-search/core-search-request-schema.js';
export {
  CoreSearchRequestSchema,
  SearchSpaceSchema,
  GapSpaceSchema,
} from './core-search/core-search-request-schema.js';
export type {
  CoreSearchCandidate,
  CoreSearchCounts,
  CoreSearchChunkOutput,
  CoreSearchResult,
} from './core-search/core-search-candidate.js';
export {
  CORE_SEARCH_COMPUTATION,
  coreSearchPlan,
  reduceCoreSearch,
} from './core-search/core-search-computation.js';
export { EXAMPLE_CORE_SEARCH_REQUEST } from './core-search/example-core-search-request.js';
export { CORE_SEARCH_CSV_COLUMNS } from './core-search/core-search-csv.js';
export {
  INFEASIBLE_TOLERANCE_CSV_COLUMNS,
  TOLERANCE_CSV_COLUMNS,
} from './tolerance/tolerance-csv.js';
export {
  CoreSearchCandidateSchema,
  CoreSearchCountsSchema,
  CoreSearchResultSchema,
} from './core-search/core-search-result-schema.js';
export { WindingWireSchema } from './transformer/winding-wire-schema.js';
export type { WindingWire } from './transformer/winding-wire.js';
