/**
 * The shortest on-time a controller gives, s, where no duty cycle holds the output: some 100 ns
 * of leading-edge blanking (common practice (from memory)). The forwards' and the flyback's
 * light-load corners below the least power a pulse delivers are solved at it.
 */
export const LIGHT_LOAD_MIN_ON_TIME_S = 100e-9;
