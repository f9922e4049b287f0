import { describe, expect, it } from 'vitest';
import { SpecSchema } from '../../../solvers/index.js';
import {
  outputShortfallIssue,
  physicalOutputV,
  shortfallPath,
} from '../../../solvers/topologies/power-not-deliverable.js';

// An invented 18–36 V to 12 V 10 A forward.
const SPEC = SpecSchema.parse({
  topology: 'two-switch-forward',
  inputVoltageMinV: 18,
  inputVoltageNominalV: 24,
  inputVoltageMaxV: 36,
  outputs: [
    {
      voltageV: 12,
      currentA: 10,
      capacitanceF: 100e-6,
      rectifier: { kind: 'diode', forwardVoltageV: 0.5 },
    },
  ],
  switchingFrequencyHz: 100e3,
  primarySwitch: { onResistanceOhm: 0.03, voltageRatingV: 100 },
});

const SHORTFALL = {
  input: 'min' as const,
  at: 'dutyCycle 0.5',
  path: ['outputs', 0, 'voltageV'],
  losslessDutyCycle: 0.45,
  dutyCycleLimit: 0.5,
};

describe('outputShortfallIssue', () => {
  it('outputShortfallIssue names the voltage reached against the regulated one', () => {
    expect(outputShortfallIssue(SPEC, { ...SHORTFALL, reachedV: 9.5 })).toEqual({
      code: 'power_not_deliverable',
      path: ['outputs', 0, 'voltageV'],
      constraint: 'outputVoltageV <= output voltage at dutyCycle 0.5',
      quantity: 'outputVoltageV',
      required: 12,
      limit: 9.5,
      corner: 'min-input/100pct-load',
    });
  });

  it('outputShortfallIssue holds a negative figure at 0 V', () => {
    // ref: common practice: a buck-derived stage's freewheeling rectifier holds its output from
    // going below zero.
    expect(outputShortfallIssue(SPEC, { ...SHORTFALL, reachedV: -0.3 }).limit).toBe(0);
  });

  it('outputShortfallIssue calls a shortfall with no physical figure, or none short, the engine’s', () => {
    for (const reachedV of [NaN, 12, 15]) {
      const issue = outputShortfallIssue(SPEC, { ...SHORTFALL, reachedV });
      expect(issue.code).toBe('steady_state_not_found');
      expect([issue.quantity, issue.required, issue.limit]).toEqual(['dutyCycle', 0.45, 0.5]);
    }
  });
});

describe('physicalOutputV', () => {
  it('physicalOutputV keeps a voltage up to the secondary’s and drops one above it', () => {
    expect(physicalOutputV(11, 30)).toBe(11);
    expect(physicalOutputV(31, 30)).toBeNaN();
    expect(physicalOutputV(-0.2, 30)).toBe(-0.2);
    expect(physicalOutputV(-31, 30)).toBeNaN();
    expect(physicalOutputV(Infinity, 30)).toBeNaN();
    expect(physicalOutputV(NaN, 30)).toBeNaN();
  });
});

describe('shortfallPath', () => {
  it('shortfallPath names the fixed turns ratio where the spec gives one', () => {
    expect(shortfallPath(SPEC)).toEqual(['outputs', 0, 'voltageV']);
    const fixed = SpecSchema.parse({ ...SPEC, transformer: { turnsRatio: 0.6 } });
    expect(shortfallPath(fixed)).toEqual(['transformer', 'turnsRatio']);
  });
});
