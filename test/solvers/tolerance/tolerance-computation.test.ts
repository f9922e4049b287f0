import { describe, expect, it } from 'vitest';
import { designConverter } from '../../../solvers/design/design-converter.js';
import { evenChunks, runChunkToEnd } from '../../../solvers/jobs/chunked-computation.js';
import type { Spec } from '../../../solvers/spec/spec-schema.js';
import { TOLERANCE_COMPUTATION } from '../../../solvers/tolerance/tolerance-computation.js';
import {
  ToleranceRequestSchema,
  type ToleranceRequestInput,
} from '../../../solvers/tolerance/tolerance-request-schema.js';
import { toleranceParameterIds } from '../../../solvers/tolerance/tolerance-parameters.js';
import {
  ToleranceJobResultSchema,
  type ToleranceResult,
} from '../../../solvers/tolerance/tolerance-result-schema.js';
import { evaluateUnit, toleranceRun } from '../../../solvers/tolerance/tolerance-run.js';
import { canonicalJson } from '../../../solvers/versioning/canonical-json.js';
import { expectClose } from '../../helpers/expect-close.js';
import { telecomSpec } from '../../helpers/flyback-specs.js';
import { forwardTelecomSpec } from '../../helpers/forward-specs.js';

// Every spec here is an invented scenario (test/helpers): not any product.

/** Runs the whole job in this process with chunks of `chunkSize` samples. */
function runJob(input: ToleranceRequestInput, chunkSize?: number) {
  const request = TOLERANCE_COMPUTATION.requestSchema.parse(input);
  const plan =
    chunkSize === undefined
      ? TOLERANCE_COMPUTATION.plan(request)
      : evenChunks(request.sampleCount, chunkSize);
  // Chunk outputs travel as JSON (through Redis on the queue backend).
  const outputs = plan.chunks.map((chunk) =>
    JSON.parse(JSON.stringify(runChunkToEnd(TOLERANCE_COMPUTATION.runChunk(request, chunk)))),
  );
  return TOLERANCE_COMPUTATION.reduce(request, outputs);
}

function feasible(result: ReturnType<typeof runJob>): ToleranceResult {
  if (!result.feasible) throw new Error(`infeasible: ${JSON.stringify(result.issues)}`);
  return result;
}

/** Every parameter fixed at its nominal value except those named. */
function onlyVarying(spec: Spec, varied: ToleranceRequestInput['tolerances']) {
  return {
    ...Object.fromEntries(
      toleranceParameterIds(spec).map((id) => [id, { kind: 'fixed' as const }]),
    ),
    ...varied,
  };
}

describe('the tolerance request', () => {
  it('fills in the documented defaults and echoes the seed', () => {
    const request = ToleranceRequestSchema.parse({ spec: forwardTelecomSpec() });
    expect(request.sampleCount).toBe(2000);
    expect(request.seed).toBe(20261202);
    expect(request.limits.outputVoltageBand).toBe(0.05);
  });

  it('names the parameters when a tolerance id is not one of them', () => {
    const parsed = ToleranceRequestSchema.safeParse({
      spec: forwardTelecomSpec(),
      tolerances: { 'transformer.gapLengthM': { kind: 'fixed' } },
    });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0]?.path).toEqual(['tolerances', 'transformer.gapLengthM']);
    expect(parsed.error?.issues[0]?.message).toContain('transformer.magnetizingInductanceH');
  });

  it('refuses a reversed band and a relative spread that reaches zero', () => {
    const parsed = ToleranceRequestSchema.safeParse({
      spec: forwardTelecomSpec(),
      tolerances: {
        'outputs.0.capacitanceF': { kind: 'uniform', scale: 'relative', lower: 0.1, upper: -0.1 },
        'primarySwitch.onResistanceOhm': { kind: 'normal', scale: 'relative', sigma: 0.4 },
      },
    });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((issue) => issue.path.at(-1)).sort()).toEqual([
      'sigma',
      'upper',
    ]);
  });
});

describe('the default spreads', () => {
  it("take a gapped core's Lm at ±10 % and an ungapped core's at its material's μi tolerance", () => {
    const lmOf = (spec: Spec) => {
      const run = toleranceRun(ToleranceRequestSchema.parse({ spec }));
      if (!run.ok) throw new Error('infeasible');
      const lm = run.value.parameters.find((p) => p.id === 'transformer.magnetizingInductanceH');
      const material = run.value.frozen.transformer?.build.material;
      return { lm, material };
    };
    // ref: common practice: a flyback's gap sets Lm (±10 %); a forward's ungapped core gives
    // Lm ∝ μi, so its spread is the material's initial-permeability tolerance.
    const flyback = lmOf(telecomSpec());
    expect(flyback.lm?.distribution).toEqual({
      kind: 'uniform',
      scale: 'relative',
      lower: -0.1,
      upper: 0.1,
    });
    const forward = lmOf({
      ...forwardTelecomSpec(),
      magnetics: { ...forwardTelecomSpec().magnetics, mode: 'design' },
    });
    const tolerance = forward.material?.initialPermeabilityTolerance ?? NaN;
    expect(forward.lm?.distribution).toEqual({
      kind: 'uniform',
      scale: 'relative',
      lower: -tolerance,
      upper: tolerance,
    });
    expect(forward.lm?.origin).toBe('default');
  });
});

describe('the frozen design', () => {
  it('reproduces the design at the nominal corner (the transformer designed and fixed in)', () => {
    const spec = telecomSpec();
    const design = designConverter(spec);
    const run = toleranceRun(ToleranceRequestSchema.parse({ spec }));
    if (!design.ok || !run.ok) throw new Error('the invented flyback must be feasible');
    const corner = design.value.corners.find((c) => c.label === 'nominal-input/100pct-load');
    if (corner === undefined) throw new Error('no nominal corner');
    const unit = run.value.nominal;
    // ref: the engine's own design (designConverter): the frozen unit at its nominal parts and
    // operating point is that design's corner, to round-off.
    expectClose(unit.corner.dutyCycle, corner.dutyCycle, { rel: 1e-9 });
    expectClose(unit.corner.efficiency, corner.efficiency, { rel: 1e-9 });
    expectClose(unit.corner.switches[0]?.voltagePeakV ?? 0, corner.switches[0]?.voltagePeakV ?? 1, {
      rel: 1e-9,
    });
    const transformerCorner = design.value.transformer?.corners.find(
      (c) => c.label === 'nominal-input/100pct-load',
    );
    expectClose(unit.transformer?.temperatureRiseK ?? 0, transformerCorner?.temperatureRiseK ?? 1, {
      rel: 1e-6,
    });
  });

  it('reproduces a forward design at the nominal corner, its output inductor wound and fixed in', () => {
    const spec = forwardTelecomSpec({ magnetics: { mode: 'design' } });
    const design = designConverter(spec);
    const run = toleranceRun(ToleranceRequestSchema.parse({ spec }));
    if (!design.ok || !run.ok) throw new Error('the invented forward must be feasible');
    const label = 'nominal-input/100pct-load';
    const corner = design.value.corners.find((c) => c.label === label);
    const inductor = design.value.outputInductors?.[0]?.corners.find((c) => c.label === label);
    if (corner === undefined || inductor === undefined) throw new Error('no nominal corner');
    const unit = run.value.nominal;
    // ref: the engine's own design (designConverter): the frozen unit at its nominal parts and
    // operating point is that design's corner, the inductor's losses included, to round-off.
    expectClose(unit.corner.dutyCycle, corner.dutyCycle, { rel: 1e-9 });
    expectClose(unit.corner.efficiency, corner.efficiency, { rel: 1e-9 });
    expect(unit.corner.losses.map((line) => line.component)).toEqual(
      corner.losses.map((line) => line.component),
    );
    expect(unit.inductors).toHaveLength(1);
    expectClose(unit.inductors?.[0]?.temperatureRiseK ?? 0, inductor.temperatureRiseK, {
      rel: 1e-6,
    });
  });

  it('keeps the turns when a part moves (a built unit does not re-choose them)', () => {
    const run = toleranceRun(ToleranceRequestSchema.parse({ spec: forwardTelecomSpec() }));
    if (!run.ok) throw new Error('infeasible');
    const { parameters, frozen } = run.value;
    const values = parameters.map((p) =>
      p.id === 'outputs.0.rectifier.forwardVoltageV' ? p.nominal * 1.1 : p.nominal,
    );
    const moved = evaluateUnit(frozen, parameters, values);
    if (!moved.solved) throw new Error('unsolved');
    const nominal = run.value.nominal.corner;
    // ref: common practice (forward converter): with the turns fixed, a larger rectifier drop is
    // made up by a longer duty cycle, Vo + Vf ≈ D·Vin/n.
    expect(moved.corner.dutyCycle).toBeGreaterThan(nominal.dutyCycle);
    const n = frozen.choices.turnsRatio;
    expectClose(moved.corner.dutyCycle - nominal.dutyCycle, (0.05 * n) / 48, { rel: 0.1 });
  });
});

describe('the tolerance job', () => {
  it('gives byte-identical results whatever the chunking', () => {
    const input = { spec: forwardTelecomSpec(), sampleCount: 60, seed: 99 };
    const whole = canonicalJson(runJob(input, 60));
    expect(canonicalJson(runJob(input, 7))).toBe(whole);
    expect(canonicalJson(runJob(input, 25))).toBe(whole);
    expect(canonicalJson(runJob(input, 1))).toBe(whole);
  });

  it('answers in the shape its schema documents (nothing more, nothing less)', () => {
    const result = runJob({ spec: forwardTelecomSpec(), sampleCount: 30 });
    expect(ToleranceJobResultSchema.parse(result)).toEqual(result);
    const infeasible = runJob({
      spec: forwardTelecomSpec({ inputVoltageMinV: 10, inputVoltageNominalV: 12 }),
      sampleCount: 3,
    });
    expect(ToleranceJobResultSchema.parse(infeasible)).toEqual(infeasible);
  });

  it('changes with the seed and reports the seed it used', () => {
    const a = feasible(runJob({ spec: forwardTelecomSpec(), sampleCount: 40, seed: 1 }));
    const b = feasible(runJob({ spec: forwardTelecomSpec(), sampleCount: 40, seed: 2 }));
    expect(a.seed).toBe(1);
    expect(b.seed).toBe(2);
    expect(canonicalJson(a.distributions)).not.toBe(canonicalJson(b.distributions));
  });

  it('shows 100 % yield for every limit no worst-case vertex violates (flyback with its transformer)', () => {
    const result = feasible(runJob({ spec: telecomSpec(), sampleCount: 400 }));
    expect(result.worstCase.method).toBe('sensitivity-signed-vertex');
    const kept = result.worstCase.perLimit.filter((row) => !row.violates);
    expect(kept.map((row) => row.limit)).toEqual(
      expect.arrayContaining(['switchVoltage', 'fluxDensity', 'temperatureRise']),
    );
    for (const row of kept) {
      const limitYield = result.yield.perLimit.find((y) => y.limit === row.limit);
      expect(limitYield?.fraction, row.limit).toBe(1);
      expect(row.agreesWithMonteCarlo).toBe(true);
      // ref: Wilson score interval (E. B. Wilson, JASA 22, 1927) at p̂ = 1: lower end n/(n + z²),
      // z = 1.96 for 95 %.
      const n = limitYield?.count ?? 0;
      expectClose(limitYield?.interval95[0] ?? 0, n / (n + 1.959963984540054 ** 2), { rel: 1e-12 });
    }
  });

  it('the same with every vertex evaluated (eight varied parameters, 256 vertices)', () => {
    const spec = forwardTelecomSpec();
    const tolerances = onlyVarying(spec, {
      inputVoltageV: { kind: 'uniform', scale: 'absolute', lower: 36, upper: 72 },
      loadFraction: { kind: 'uniform', scale: 'absolute', lower: 0.1, upper: 1 },
      regulationSetpoint: { kind: 'normal', scale: 'relative', sigma: 0.004 },
      switchingFrequencyHz: { kind: 'band', scale: 'relative', lower: -0.05, upper: 0.05 },
      'transformer.leakageInductanceH': {
        kind: 'uniform',
        scale: 'relative',
        lower: -0.2,
        upper: 0.2,
      },
      'primarySwitch.onResistanceOhm': {
        kind: 'uniform',
        scale: 'relative',
        lower: -0.2,
        upper: 0.2,
      },
      'outputs.0.capacitanceF': { kind: 'uniform', scale: 'relative', lower: -0.2, upper: 0.2 },
      'outputs.0.capacitorEsrOhm': { kind: 'uniform', scale: 'relative', lower: -0.3, upper: 0.3 },
    });
    const result = feasible(runJob({ spec, sampleCount: 300, tolerances }));
    expect(result.worstCase.method).toBe('every-vertex');
    // The sensitivity-signed vertex finds the same worst switch stress (monotonic in each part).
    const signed = feasible(
      runJob({ spec, sampleCount: 1, tolerances, worstCase: { everyVertexParameterMax: 0 } }),
    );
    expect(signed.worstCase.method).toBe('sensitivity-signed-vertex');
    const stressOf = (r: ToleranceResult) =>
      r.worstCase.perLimit.find((row) => row.limit === 'switchVoltage')?.worstValue;
    expect(stressOf(signed)).toBe(stressOf(result));
    expect(result.worstCase.variedParameterCount).toBe(8);
    expect(result.worstCase.evaluationCount).toBe(256 + 16);
    for (const row of result.worstCase.perLimit.filter((r) => !r.violates)) {
      expect(result.yield.perLimit.find((y) => y.limit === row.limit)?.fraction, row.limit).toBe(1);
      // No sample lies beyond the worst vertex (the quantities are monotonic in each part here).
      expect(row.monteCarloExtreme ?? 0).toBeLessThanOrEqual((row.worstValue ?? 0) * (1 + 1e-12));
    }
  });

  it('fails a limit set tight enough in both analyses', () => {
    // The forward's switches block Vin plus a clamp diode's drop: an 81 V rating at 0.9 derating
    // (72.9 V) holds over the spec's 36–72 V, so the design is feasible, but not over line
    // excursions to 76 V that the input-voltage tolerance asks about.
    const spec = forwardTelecomSpec({
      primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 81 },
    });
    const result = feasible(
      runJob({
        spec,
        sampleCount: 200,
        tolerances: {
          inputVoltageV: { kind: 'uniform', scale: 'absolute', lower: 36, upper: 76 },
        },
      }),
    );
    const worst = result.worstCase.perLimit.find((row) => row.limit === 'switchVoltage');
    const monteCarlo = result.yield.perLimit.find((row) => row.limit === 'switchVoltage');
    expect(worst?.violates).toBe(true);
    expect(worst?.vertex['inputVoltageV']).toBe('upper');
    expect(monteCarlo?.failCount).toBeGreaterThan(0);
    expect(monteCarlo?.fraction).toBeLessThan(1);
    expect(monteCarlo?.firstFailures[0]?.parameters['inputVoltageV']).toBeGreaterThan(72);
    expect(result.yield.overall.passCount).toBeLessThan(200);
    // The input voltage drives it: first in the ranking.
    const ranking = result.sensitivity.perLimit.find((row) => row.limit === 'switchVoltage');
    expect(ranking?.ranking[0]?.parameter).toBe('inputVoltageV');
    // Failures sit at the top of the input band: a uniform variate's mean over its top
    // (72.1–76 V) lies about 1.6 standard deviations above its mean over the whole 36–76 V band
    // ((74.05 − 56)/(40/√12); uniform distribution).
    const shift = ranking?.ranking[0]?.failureShift ?? 0;
    expectClose(shift, (74.05 - 56) / (40 / Math.sqrt(12)), { rel: 0.1 });
  });

  it('matches the closed-form yield of a uniform input against a switch-voltage threshold', () => {
    // The flyback's switch blocks Vin + Vclamp with the clamp voltage fixed by the design (ref:
    // common practice, the RCD-clamped flyback's drain voltage), so its utilization is linear in
    // Vin and the unit fails above one input voltage Vt. With Vin uniform on [48, 96] V (line
    // excursions beyond the spec's 36–72 V) and nothing else varying, the yield is (Vt − 48)/48
    // (uniform distribution); the count of passing samples is binomial, so the estimate must lie
    // within 4 standard errors √(p(1 − p)/N).
    const base = telecomSpec({ magnetics: { mode: 'assume' } });
    const tolerances = onlyVarying(base, {
      inputVoltageV: { kind: 'uniform', scale: 'absolute', lower: 48, upper: 96 },
    });
    const probe = feasible(runJob({ spec: base, sampleCount: 1, tolerances }));
    const nominal = probe.limits.find((l) => l.id === 'switchVoltage')?.nominalValue ?? NaN;
    const ratingV = base.primarySwitch.voltageRatingV;
    const clampV = nominal * ratingV - base.inputVoltageNominalV;
    // A derating that puts the threshold at Vt = 80 V (above the spec's 72 V, so the design
    // itself is feasible): yield 2/3.
    const thresholdV = 80;
    const derating = (thresholdV + clampV) / ratingV;
    const spec = { ...base, limits: { ...base.limits, switchVoltageDerating: derating } };
    const sampleCount = 2000;
    const result = feasible(runJob({ spec, sampleCount, tolerances }));
    const figure = result.yield.perLimit.find((row) => row.limit === 'switchVoltage');
    const p = (thresholdV - 48) / 48;
    expect(figure?.count).toBe(sampleCount);
    expect(Math.abs((figure?.fraction ?? 0) - p)).toBeLessThan(
      4 * Math.sqrt((p * (1 - p)) / sampleCount),
    );
    const swing = result.sensitivity.perLimit
      .find((row) => row.limit === 'switchVoltage')
      ?.ranking.find((row) => row.parameter === 'inputVoltageV');
    // ref: d(Vin + Vclamp)/dVin = 1 over the 48 V band: a utilization swing of 48 V/rating.
    expectClose(swing?.oneAtATimeSwing ?? 0, 48 / ratingV, { rel: 1e-9 });
    expectClose(swing?.correlation ?? 0, 1, { abs: 1e-9 });
  });

  it("reports a spread that reaches a positive quantity's zero as an issue at its tolerance", () => {
    const result = runJob({
      spec: forwardTelecomSpec(),
      sampleCount: 5,
      tolerances: {
        'transformer.leakageInductanceH': { kind: 'normal', scale: 'absolute', sigma: 1 },
      },
    });
    expect(result.feasible).toBe(false);
    if (result.feasible) return;
    expect(result.issues).toEqual([
      expect.objectContaining({
        code: 'non_physical_value',
        path: ['tolerances', 'transformer.leakageInductanceH'],
      }),
    ]);
  });

  it('reports an infeasible nominal design as issues, with the seed', () => {
    const spec = forwardTelecomSpec({ inputVoltageMinV: 10, inputVoltageNominalV: 12 });
    const result = runJob({ spec, sampleCount: 10, seed: 5 });
    expect(result.feasible).toBe(false);
    if (result.feasible) return;
    expect(result.seed).toBe(5);
    expect(result.issues.length).toBeGreaterThan(0);
  });
});
