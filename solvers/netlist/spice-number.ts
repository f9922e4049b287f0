/**
 * Returns `value` as a plain SPICE number (decimal or e-notation, 9 significant digits, no scale
 * suffix, since SPICE reads both `m` and `M` as milli).
 * @throws RangeError for NaN or ±Infinity: a netlist must never carry them.
 */
export function spiceNumber(value: number): string {
  if (!Number.isFinite(value)) {
    throw new RangeError(`spiceNumber: value must be finite, got ${value}`);
  }
  // Number(...) drops trailing zeros; JavaScript writes small and large values in e-notation.
  return String(Number(value.toPrecision(9)));
}
