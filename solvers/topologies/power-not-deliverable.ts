import type { Issue } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';

/**
 * The choice's issue when no turns ratio gives the outputs' power at the lowest input and full
 * load (the forward family and the double-ended family; the flyback's own names the power it
 * could deliver): the outputs' power required, against nothing deliverable.
 */
export function powerNotDeliverableIssue(spec: Spec): Issue {
  return {
    code: 'power_not_deliverable',
    path: ['outputs'],
    constraint: 'outputPowerW <= deliverablePowerW',
    quantity: 'outputPowerW',
    required: spec.outputs.reduce((sum, o) => sum + o.voltageV * o.currentA, 0),
    limit: 0,
  };
}
