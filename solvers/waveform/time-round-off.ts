/**
 * Relative round-off (fraction of the period) below which two breakpoint times are taken to be
 * equal. Times such as D·T + (1 − D)·T carry a few ulps of error (~1e-16 relative); 1e-12
 * leaves ample margin and is still far below any physical interval of a converter period.
 */
export const TIME_ROUND_OFF = 1e-12;
