import type { ForwardReset } from './two-switch-forward-state.js';

/**
 * The two-switch forward's own duty-cycle limit: the clamp diodes reset the core at −Vin, the
 * same magnitude as the on-voltage, so volt-second balance needs D ≤ 0.5.
 * ref: common practice; Mohan, Undeland, Robbins, 3rd ed. (from memory), §10-4.
 */
export const TWO_SWITCH_FORWARD_DUTY_CYCLE_MAX = 0.5;

/**
 * Returns a forward's own duty-cycle limit (0..1): 0.5 with clamp diodes, 1/(1 + Nr/Np) with a
 * reset winding, from volt-second balance Vin·D = Vin·(Np/Nr)·(1 − D) (Mohan, Undeland, Robbins,
 * 3rd ed. (from memory), §10-4-1).
 */
export function forwardDutyCycleLimit(reset: ForwardReset): number {
  return reset.kind === 'clamp-diodes'
    ? TWO_SWITCH_FORWARD_DUTY_CYCLE_MAX
    : 1 / (1 + reset.resetTurnsRatio);
}
