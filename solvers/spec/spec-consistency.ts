import type { z } from 'zod';
import type { HoldUp } from './hold-up-schema.js';
import { holdUpVoltages } from './hold-up-voltages.js';

/** The spec fields whose mutual consistency is checked at parse time. */
export interface SpecConsistencyFields {
  inputVoltageMinV: number;
  inputVoltageNominalV: number;
  inputVoltageMaxV: number;
  holdUp?: HoldUp | undefined;
  outputs?: readonly unknown[];
  transformer?: { turnsRatio?: number | undefined; outputTurnsRatios?: number[] | undefined };
  magnetics?: { outputInductors?: readonly { outputIndex: number }[] | undefined };
}

/**
 * Adds a parse issue (a 400 at the HTTP edge, with the field's path) for each field that
 * contradicts another: input voltages out of order, and hold-up voltages outside the input range
 * or not falling (start ≤ end would need no capacitor or an infinite one). Messages carry the
 * numbers, defaults applied.
 */
export function checkSpecConsistency(spec: SpecConsistencyFields, ctx: z.RefinementCtx): void {
  if (spec.inputVoltageNominalV < spec.inputVoltageMinV) {
    ctx.addIssue({
      code: 'custom',
      path: ['inputVoltageNominalV'],
      message: 'must be at least inputVoltageMinV',
    });
  }
  if (spec.inputVoltageMaxV < spec.inputVoltageNominalV) {
    ctx.addIssue({
      code: 'custom',
      path: ['inputVoltageMaxV'],
      message: 'must be at least inputVoltageNominalV',
    });
  }
  if (spec.holdUp !== undefined) checkHoldUp(spec, spec.holdUp, ctx);
  checkTurnsRatios(spec, ctx);
  checkInductorOutputs(spec, ctx);
}

/** A fixed output inductor names an output the spec has. */
function checkInductorOutputs(spec: SpecConsistencyFields, ctx: z.RefinementCtx): void {
  const outputCount = spec.outputs?.length ?? 0;
  (spec.magnetics?.outputInductors ?? []).forEach((entry, i) => {
    if (entry.outputIndex >= outputCount) {
      ctx.addIssue({
        code: 'custom',
        path: ['magnetics', 'outputInductors', i, 'outputIndex'],
        message: `must name one of the ${outputCount} outputs (0 to ${outputCount - 1})`,
      });
    }
  });
}

/** Fixed output turns ratios: one per output, the first equal to turnsRatio when both are given. */
function checkTurnsRatios(spec: SpecConsistencyFields, ctx: z.RefinementCtx): void {
  const ratios = spec.transformer?.outputTurnsRatios;
  if (ratios === undefined) return;
  const outputCount = spec.outputs?.length ?? ratios.length;
  if (ratios.length !== outputCount) {
    ctx.addIssue({
      code: 'custom',
      path: ['transformer', 'outputTurnsRatios'],
      message: `must have one ratio per output (${outputCount})`,
    });
  }
  const first = ratios[0];
  const given = spec.transformer?.turnsRatio;
  if (first !== undefined && given !== undefined && Math.abs(first / given - 1) > 1e-9) {
    ctx.addIssue({
      code: 'custom',
      path: ['transformer', 'outputTurnsRatios', 0],
      message: `must equal turnsRatio ${given}`,
    });
  }
}

function checkHoldUp(spec: SpecConsistencyFields, holdUp: HoldUp, ctx: z.RefinementCtx): void {
  const { startVoltageV, endVoltageV } = holdUpVoltages(holdUp, spec);
  const issue = (field: string | undefined, message: string) =>
    ctx.addIssue({ code: 'custom', path: field ? ['holdUp', field] : ['holdUp'], message });
  // The converter is designed, and its input power known, only between its minimum and maximum.
  if (startVoltageV > spec.inputVoltageMaxV) {
    issue(
      'startVoltageV',
      `start voltage ${startVoltageV} V must be at most inputVoltageMaxV ${spec.inputVoltageMaxV} V`,
    );
  }
  if (endVoltageV < spec.inputVoltageMinV) {
    issue(
      'endVoltageV',
      `end voltage ${endVoltageV} V must be at least inputVoltageMinV ${spec.inputVoltageMinV} V`,
    );
  }
  if (startVoltageV <= endVoltageV) {
    // Point at the field the client wrote; with both defaulted, at the block itself.
    const field =
      holdUp.endVoltageV !== undefined
        ? 'endVoltageV'
        : holdUp.startVoltageV !== undefined
          ? 'startVoltageV'
          : undefined;
    issue(
      field,
      `end voltage ${endVoltageV} V must be below start voltage ${startVoltageV} V (defaults: start inputVoltageNominalV, end inputVoltageMinV)`,
    );
  }
}
