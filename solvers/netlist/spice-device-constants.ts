/**
 * Device constants every exported netlist uses, so that the decks model diodes, switches and
 * their capacitances alike.
 */

/** Saturation current of the rectifier and clamp diode knees, A (with N = 1). */
export const KNEE_SATURATION_CURRENT_A = 1e-6;
/** kT/q at the simulator's 27 °C, V. ref: CODATA 2018 exact values of k and e */
export const THERMAL_VOLTAGE_27C_V = (1.380649e-23 * 300.15) / 1.602176634e-19;
/** Resistance of an ideal switch when off, Ω. */
export const SWITCH_OFF_RESISTANCE_OHM = 1e7;
/** Resistance in series with each switch's drain capacitance, Ω (damps the edge). */
export const COSS_SERIES_RESISTANCE_OHM = 1;
/** Smallest drain capacitance a deck gives a switch, F (keeps the edges solvable). */
export const DRAIN_CAPACITANCE_MIN_F = 10e-12;
/**
 * Resistance in series with a reset winding's diode, Ω. The reset winding is an ideal controlled
 * source pair; with its diode alone in that loop ngspice stopped with "timestep too small" at the
 * diode (one corner in a few dozen, at random: the 36–72 V scan corner of DEVELOPERS.md, "The
 * ngspice check"). 10 mΩ, a short winding's copper, lets those run and moves the clamp's level by
 * under a millivolt at the magnetizing current it returns.
 */
export const RESET_PATH_RESISTANCE_OHM = 0.01;
