/**
 * The damping the push-pull's leakage rings are taken with, engine and deck alike: a resistance
 * of this many ring impedances, √(Llk/Coss), across each half's leakage (a ring of one leakage
 * with one drain then has a Q of about this figure: R/(ω·Llk) = R/√(Llk/Coss)). An assumption
 * about the transformer, not a part: no resistor sits across a real leakage, whose own losses
 * (winding, core, the drain's) damp its ring lightly. 10 is the figure the push-pull deck with
 * its clamp has used since the turn-on ring was modelled (DEVELOPERS.md, "The push-pull's turn-on
 * ring": 3 took a tenth of the overshoot, 30 outlasted the on-time); the engine takes it where
 * the dead time is shorter than the ring's decay (`push-pull-short-dead-time.ts`), where the
 * off drain's level at the next turn-on depends on it.
 */
export const LEAKAGE_DAMPING_RATIO = 10;
