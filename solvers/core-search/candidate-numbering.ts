import type { CoreSearchSpace, FrequencySpace } from './search-space.js';

/**
 * Where a candidate sits in the space: the frequency, and the index into each dimension of that
 * frequency's space (shape, material, turns step, gap, each winding's wire, arrangement).
 */
export interface CandidateCoordinates {
  frequency: number;
  shape: number;
  material: number;
  turns: number;
  gap: number;
  wires: number[];
  arrangement: number;
}

/**
 * The candidate numbered `index`: frequencies in increasing order, then shape, material, primary
 * turns, gap, the wire of each winding (primary first) and arrangement, the last varying fastest
 * (a mixed-radix number). So one shape's candidates at one frequency are consecutive: a block.
 * @throws RangeError for an index outside [0, total).
 */
export function candidateCoordinates(space: CoreSearchSpace, index: number): CandidateCoordinates {
  if (!Number.isInteger(index) || index < 0 || index >= space.total) {
    throw new RangeError(`candidateCoordinates: index ${index} outside [0, ${space.total})`);
  }
  const frequency = space.frequencies.findIndex(
    (f) => index >= f.offset && index < f.offset + f.count,
  );
  const f = space.frequencies[frequency] as FrequencySpace;
  let local = index - f.offset;
  const shape = Math.floor(local / f.blockSize);
  local -= shape * f.blockSize;
  const digits: number[] = new Array<number>(f.radices.length);
  for (let d = f.radices.length - 1; d >= 0; d--) {
    const radix = f.radices[d] as number;
    digits[d] = local % radix;
    local = Math.floor(local / radix);
  }
  const windingCount = f.wireOptions.length;
  return {
    frequency,
    shape,
    material: digits[0] as number,
    turns: digits[1] as number,
    gap: digits[2] as number,
    wires: digits.slice(3, 3 + windingCount),
    arrangement: digits[3 + windingCount] as number,
  };
}

/**
 * The number of the candidate at `coordinates` (the inverse of {@link candidateCoordinates}).
 * @throws RangeError for coordinates outside the space.
 */
export function candidateIndex(space: CoreSearchSpace, c: CandidateCoordinates): number {
  const f = space.frequencies[c.frequency];
  if (f === undefined || c.wires.length !== f.wireOptions.length) {
    throw new RangeError('candidateIndex: coordinates outside the space');
  }
  const digits = [c.material, c.turns, c.gap, ...c.wires, c.arrangement];
  if (!(c.shape >= 0 && c.shape < f.shapes.length)) {
    throw new RangeError('candidateIndex: coordinates outside the space');
  }
  let local = 0;
  digits.forEach((digit, d) => {
    const radix = f.radices[d] as number;
    if (!(Number.isInteger(digit) && digit >= 0 && digit < radix)) {
      throw new RangeError('candidateIndex: coordinates outside the space');
    }
    local = local * radix + digit;
  });
  return f.offset + c.shape * f.blockSize + local;
}
