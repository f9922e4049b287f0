import { designConverter, resultMeta } from '../../solvers/index.js';
import type { Design, Result, Spec } from '../../solvers/index.js';
import type { DesignContent } from '../stores/design-store.js';
import type { MaterialStore } from '../stores/material-store.js';
import { resolveSpecMaterial } from './resolve-spec-material.js';

/** A content as the engine made it: the design with its corners' waveforms. */
export interface EvaluatedContent extends DesignContent {
  design: Design;
}

/**
 * Evaluates one parsed spec inline: a user material it names put inline first (its note added to
 * the design's model notes), then the engine's design and its provenance (hash of that spec,
 * defaults applied, so the same spec always hashes the same), or the engine's issues.
 * `onEngineCpuS` is told the CPU time the engine took, s (for the metrics).
 * @throws ProblemError 422 when the spec's materialId names no material.
 */
export async function evaluateSpec(
  parsed: Spec,
  {
    materials,
    tenant,
    onEngineCpuS,
  }: { materials: MaterialStore; tenant: string; onEngineCpuS?: (seconds: number) => void },
): Promise<Result<EvaluatedContent>> {
  const { spec, notes } = await resolveSpecMaterial(parsed, materials, tenant);
  // designConverter is synchronous: the process's CPU time across it is the engine's alone.
  const before = onEngineCpuS === undefined ? undefined : process.cpuUsage();
  const converted = designConverter(spec);
  if (before !== undefined) {
    const used = process.cpuUsage(before);
    onEngineCpuS?.((used.user + used.system) / 1e6);
  }
  if (!converted.ok) return converted;
  const design =
    notes.length === 0
      ? converted.value
      : { ...converted.value, modelNotes: [...converted.value.modelNotes, ...notes] };
  return { ok: true, value: { spec, design, meta: await resultMeta(spec) } };
}
