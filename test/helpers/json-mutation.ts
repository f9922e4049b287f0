import fc from 'fast-check';

/** A JSON path into a value: keys and indexes from its root. */
type JsonPath = Array<string | number>;

/** Every path to a node of a plain JSON value (the root is []). */
export function jsonPaths(value: unknown, at: JsonPath = []): JsonPath[] {
  const paths: JsonPath[] = [at];
  if (Array.isArray(value)) {
    value.forEach((item, index) => paths.push(...jsonPaths(item, [...at, index])));
  } else if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) paths.push(...jsonPaths(item, [...at, key]));
  }
  return paths;
}

function getAt(value: unknown, path: JsonPath): unknown {
  return path.reduce<unknown>(
    (node, key) => (node as Record<string | number, unknown> | undefined)?.[key],
    value,
  );
}

/** A deep copy of `value` with the node at `path` replaced (undefined: removed). */
export function setAt(value: unknown, path: JsonPath, replacement: unknown): unknown {
  if (path.length === 0) return replacement;
  const copy: unknown = structuredClone(value);
  const parent = getAt(copy, path.slice(0, -1)) as Record<string | number, unknown>;
  const last = path[path.length - 1] as string | number;
  if (replacement === undefined) {
    if (Array.isArray(parent) && typeof last === 'number') parent.splice(last, 1);
    else delete parent[last];
  } else {
    parent[last] = replacement;
  }
  return copy;
}

/** Numbers that break careless code: zero, signs, extremes, the edges of float64. */
const EDGE_NUMBERS = [
  0,
  -0,
  1,
  -1,
  0.5,
  1e-300,
  -1e-300,
  1e300,
  -1e300,
  Number.MAX_SAFE_INTEGER,
  Number.MIN_VALUE,
  2 ** 31,
  -(2 ** 31),
  1e-9,
  1e9,
  0.999999,
  1.000001,
];

/** A JSON value of any kind, small: what a confused or hostile client might send instead. */
export const anyJson: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(...EDGE_NUMBERS),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
  fc.string({ maxLength: 40 }),
  fc.constantFrom('', ' ', 'null', '1e999', '<script>', '\u0000', '../../etc', 'NaN'),
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.integer(), { maxLength: 3 }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.integer(), { maxKeys: 3 }),
);

/**
 * One mutation of `base`: a node replaced by any JSON value, a node removed, an unknown key
 * added, or a number scaled by a factor from 1e-3 to 1e3 (or its sign flipped) — the last keeps
 * the request schema-valid often enough to drive the engine into odd but legal corners.
 */
export function mutated(base: unknown): fc.Arbitrary<unknown> {
  const paths = jsonPaths(base);
  const numberPaths = paths.filter((path) => typeof getAt(base, path) === 'number');
  const objectPaths = paths.filter((path) => {
    const node = getAt(base, path);
    return node !== null && typeof node === 'object' && !Array.isArray(node);
  });
  const strategies: Array<fc.Arbitrary<unknown>> = [
    fc.tuple(fc.constantFrom(...paths), anyJson).map(([path, value]) => setAt(base, path, value)),
    fc.constantFrom(...paths).map((path) => setAt(base, path, undefined)),
  ];
  if (objectPaths.length > 0) {
    strategies.push(
      fc
        .tuple(fc.constantFrom(...objectPaths), fc.string({ minLength: 1, maxLength: 12 }), anyJson)
        .map(([path, key, value]) => setAt(base, [...path, key], value)),
    );
  }
  if (numberPaths.length > 0) {
    const scaled = fc
      .tuple(
        fc.constantFrom(...numberPaths),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.boolean(),
      )
      .map(([path, exponent, flip]) => {
        const node = getAt(base, path) as number;
        return setAt(base, path, (flip ? -1 : 1) * node * 10 ** exponent);
      });
    // Scaled numbers keep a request well-formed most often: weigh them up.
    strategies.push(scaled, scaled, scaled);
  }
  return fc.oneof(...strategies);
}

/** One to `most` mutations of `base`, applied in turn. */
export function mutatedRequest(base: unknown, most = 3): fc.Arbitrary<unknown> {
  const once = mutated(base);
  if (most <= 1) return once;
  return fc.oneof(
    once,
    once.chain((next) => mutatedRequest(next, most - 1)),
  );
}
