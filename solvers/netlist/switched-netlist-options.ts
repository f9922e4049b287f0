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
  /** Fraction of each on-time skipped at its start for the switch current peak. @defaultValue 0.05 */
  onTimeSkipFraction?: number;
}

/** The defaults of {@link SwitchedNetlistOptions}. */
export const SWITCHED_NETLIST_DEFAULTS = {
  cornerLabel: '',
  periodsToSimulate: 0,
  stepsPerPeriod: 200,
  onTimeSkipFraction: 0.05,
} satisfies Required<SwitchedNetlistOptions>;
