import { describe, expect, it } from 'vitest';
import { SpecSchema } from '../../../solvers/spec/spec-schema.js';
import { busSpec } from '../../helpers/flyback-specs.js';

/** The bus scenario as a client sends it (SpecSchema parses its own output unchanged). */
const base = busSpec();

function pathsOf(input: unknown): (string | number)[][] {
  const parsed = SpecSchema.safeParse(input);
  return parsed.success ? [] : parsed.error.issues.map((issue) => [...issue.path] as never);
}

describe('SpecSchema holdUp', () => {
  it('SpecSchema.parse(spec without holdUp) leaves holdUp out of the parsed spec', () => {
    // ref: spec contract, an optional block without a default is not echoed when absent
    expect('holdUp' in SpecSchema.parse(base)).toBe(false);
  });

  it('SpecSchema.parse(holdUp with only timeS) keeps it as sent: the voltages default in the engine', () => {
    // ref: spec contract, defaults that depend on other fields are applied by the engine
    expect(SpecSchema.parse({ ...base, holdUp: { timeS: 0.01 } }).holdUp).toEqual({ timeS: 0.01 });
  });

  it('SpecSchema rejects an end voltage at or above the start voltage, at the field sent', () => {
    // ref: common practice: a hold-up capacitor must discharge, Vend < Vstart
    expect(pathsOf({ ...base, holdUp: { timeS: 0.01, endVoltageV: 325 } })).toEqual([
      ['holdUp', 'endVoltageV'],
    ]);
    expect(pathsOf({ ...base, holdUp: { timeS: 0.01, startVoltageV: 120 } })).toEqual([
      ['holdUp', 'startVoltageV'],
    ]);
    // Both defaulted: nominal equal to minimum input leaves nothing to discharge.
    expect(pathsOf({ ...base, inputVoltageNominalV: 120, holdUp: { timeS: 0.01 } })).toEqual([
      ['holdUp'],
    ]);
  });

  it('SpecSchema rejects hold-up voltages outside the input range the converter is designed for', () => {
    // ref: common practice: the converter runs only between its minimum and maximum input
    expect(pathsOf({ ...base, holdUp: { timeS: 0.01, endVoltageV: 100 } })).toEqual([
      ['holdUp', 'endVoltageV'],
    ]);
    expect(pathsOf({ ...base, holdUp: { timeS: 0.01, startVoltageV: 400 } })).toEqual([
      ['holdUp', 'startVoltageV'],
    ]);
  });

  it('SpecSchema names the numbers in a hold-up message', () => {
    const parsed = SpecSchema.safeParse({ ...base, holdUp: { timeS: 0.01, endVoltageV: 330 } });
    // ref: spec contract, a 400 names the values that contradict each other
    expect(parsed.error?.issues[0]?.message).toBe(
      'end voltage 330 V must be below start voltage 325 V (defaults: start inputVoltageNominalV, end inputVoltageMinV)',
    );
  });

  it('SpecSchema still rejects input voltages out of order', () => {
    // ref: spec contract, Vmin ≤ Vnom ≤ Vmax
    expect(pathsOf({ ...base, inputVoltageNominalV: 100 })).toEqual([['inputVoltageNominalV']]);
    expect(pathsOf({ ...base, inputVoltageMaxV: 300 })).toEqual([['inputVoltageMaxV']]);
  });
});
