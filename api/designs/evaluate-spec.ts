import { designConverter, resultMeta } from '../../solvers/index.js';
import type { Result, Spec } from '../../solvers/index.js';
import type { DesignContent } from '../stores/design-store.js';

/**
 * Evaluates one parsed spec inline: the engine's design and its provenance (hash of the parsed
 * spec, defaults applied, so the same spec always hashes the same), or the engine's issues.
 */
export async function evaluateSpec(spec: Spec): Promise<Result<DesignContent>> {
  const converted = designConverter(spec);
  if (!converted.ok) return converted;
  return { ok: true, value: { spec, design: converted.value, meta: await resultMeta(spec) } };
}
