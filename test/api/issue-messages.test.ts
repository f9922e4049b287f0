import { describe, expect, it } from 'vitest';
import { issueMessage, issuesDetail } from '../../api/issue-messages.js';
import { ISSUE_CODES, type Issue } from '../../solvers/index.js';

const dutyCycleIssue: Issue = {
  code: 'duty_cycle_limit',
  path: ['transformer', 'turnsRatio'],
  constraint: 'dutyCycle <= dutyCycleMax',
  quantity: 'dutyCycle',
  required: 0.71234,
  limit: 0.65,
  corner: 'min-input/100pct-load',
};

describe('issueMessage', () => {
  it('issueMessage(duty_cycle_limit) names quantity, value, corner and limit', () => {
    expect(issueMessage(dutyCycleIssue)).toBe(
      'dutyCycle 0.7123 needed at min-input/100pct-load exceeds the limit 0.65 (dutyCycle <= dutyCycleMax)',
    );
  });

  it('issueMessage puts the unit its suffix names after each number', () => {
    const message = issueMessage({
      code: 'switch_voltage_rating',
      path: ['primarySwitch', 'voltageRatingV'],
      constraint: 'switchVoltagePeakV <= switchVoltageDerating * voltageRatingV',
      quantity: 'switchVoltagePeakV',
      required: 196.40001,
      limit: 180,
      corner: 'max-input/100pct-load',
    });
    expect(message).toBe(
      'switchVoltagePeakV 196.4 V at max-input/100pct-load exceeds the derated switch rating 180 V (switchVoltagePeakV <= switchVoltageDerating * voltageRatingV)',
    );
  });

  it('issueMessage writes °C for a temperature and Ω for a resistance', () => {
    const base = { ...dutyCycleIssue, code: 'non_physical_value' as const };
    delete (base as Partial<Issue>).corner;
    expect(
      issueMessage({ ...base, quantity: 'windingTemperatureC', required: 250, limit: 200 }),
    ).toMatch(/^windingTemperatureC 250 °C is outside its physical range \(limit 200 °C\)/);
    expect(
      issueMessage({ ...base, quantity: 'loadResistanceOhm', required: -1, limit: 0 }),
    ).toMatch(/^loadResistanceOhm -1 Ω/);
  });

  it('issueMessage(power_not_deliverable) says "reaches" for a voltage and "can deliver" for a power', () => {
    const base = { ...dutyCycleIssue, code: 'power_not_deliverable' as const };
    expect(
      issueMessage({
        ...base,
        constraint: 'outputVoltageV <= output voltage at dutyCycle 0.5',
        quantity: 'outputVoltageV',
        required: 12,
        limit: 11.97,
      }),
    ).toBe(
      'outputVoltageV 12 V needed at min-input/100pct-load is above the 11.97 V the converter reaches (outputVoltageV <= output voltage at dutyCycle 0.5)',
    );
    expect(
      issueMessage({ ...base, quantity: 'outputPowerW', required: 95.3, limit: 33.44 }),
    ).toMatch(
      /^outputPowerW 95.3 W needed at min-input\/100pct-load exceeds the 33.44 W the converter can deliver/,
    );
  });

  it('issueMessage(steady_state_not_found) gives the lossless duty cycle and its limit', () => {
    expect(
      issueMessage({
        ...dutyCycleIssue,
        code: 'steady_state_not_found',
        constraint: 'a steady state with dutyCycle <= dutyCycleLimit holds outputVoltageV',
        required: 0.2252,
        limit: 0.65,
        corner: 'max-input/100pct-load',
      }),
    ).toBe(
      "no steady state found at max-input/100pct-load, though dutyCycle 0.2252 would do without losses (limit 0.65): the engine's model does not hold there (a steady state with dutyCycle <= dutyCycleLimit holds outputVoltageV)",
    );
  });

  it('issueMessage has a sentence for every issue code the engine defines', () => {
    for (const code of ISSUE_CODES) {
      const message = issueMessage({ ...dutyCycleIssue, code });
      expect(message).toContain('0.7123');
      expect(message).toContain('0.65');
    }
  });

  it('issuesDetail joins the sentences of several issues with "; "', () => {
    const second = { ...dutyCycleIssue, corner: 'min-input/50pct-load', required: 0.7 };
    expect(issuesDetail([dutyCycleIssue, second]).split('; ')).toEqual([
      issueMessage(dutyCycleIssue),
      issueMessage(second),
    ]);
  });
});
