/** Options of the buck-derived decks (forwards, active clamp, push-pull, bridges); all optional. */
export interface SwitchedNetlistOptions {
  /** Label of the corner to simulate; '' picks the lowest input at the largest load. @defaultValue '' */
  cornerLabel?: string;
  /**
   * Switching periods simulated; 0 picks the deck's own minimum or enough output-filter rings to
   * settle, whichever is longer. @defaultValue 0
   */
  periodsToSimulate?: number;
  /** Largest time step is periodS / stepsPerPeriod. @defaultValue 200 */
  stepsPerPeriod?: number;
  /**
   * Push-pull and bridge decks: where this is above 0, the largest step also gives the leakage's
   * ring with the drain capacitance (2π·√(Llk·C)) this many steps, down to a 32nd of the step
   * above (a quarter until 2026-12-05: with 2 µH at 193 kHz that gave 32 asked steps some 14,
   * and ngspice's ring ran 9 % slow; DEVELOPERS.md, "The push-pull's short dead time"); 0 leaves
   * it to the step. Gear integration takes about 390/S³ of an undamped ring each period of it at
   * S steps, so at the default step a ring of a few steps dies early and its peaks read low (the
   * scan's 200–400 V push-pulls with 10 µH: 3–6 % on the switch peaks, DEVELOPERS.md, "The
   * ngspice check"); 32 settles them within about 0.2 %, for some 1.5–4 times the run time. The
   * push-pull deck takes 32 by default (its rings are the engine's, with the damping the deck
   * states across each leakage; DEVELOPERS.md, "The push-pull's turn-off spike against a
   * ring-resolved deck"); the bridges 32 where their light-load ring runs (a shared fall, where
   * the engine carries that ring undamped; DEVELOPERS.md, "The ngspice check", audit5), else 0.
   * The forward decks do not read it: their step is `stepsPerPeriod`'s alone.
   * @defaultValue 32 on the push-pull and on a bridge's shared-fall corners, else 0
   */
  leakageRingStepsMin?: number;
  /** Fraction of each on-time skipped at its start for the switch current peak. @defaultValue 0.05 */
  onTimeSkipFraction?: number;
}

/** The defaults of {@link SwitchedNetlistOptions}. */
export const SWITCHED_NETLIST_DEFAULTS = {
  cornerLabel: '',
  periodsToSimulate: 0,
  stepsPerPeriod: 200,
  leakageRingStepsMin: 0,
  onTimeSkipFraction: 0.05,
} satisfies Required<SwitchedNetlistOptions>;
