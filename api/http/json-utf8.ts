/**
 * How many object levels jsonUtf8 splits into members: the content (`spec`, `design`, `meta`)
 * and the design's own members, which keeps the 90 kB of corners apart from the few notes that
 * hold characters beyond Latin-1.
 */
const SPLIT_DEPTH = 2;

/** An object JSON.stringify writes member by member: plain, and with no toJSON of its own. */
const isPlainObject = (value: unknown): value is Record<string, unknown> => {
  if (typeof value !== 'object' || value === null) return false;
  const prototype = Object.getPrototypeOf(value) as unknown;
  return (
    (prototype === Object.prototype || prototype === null) &&
    typeof (value as { toJSON?: unknown }).toJSON !== 'function'
  );
};

/** Appends the UTF-8 of `value`'s JSON to `parts`, member by member down to `depth` levels. */
function appendJson(value: Record<string, unknown>, depth: number, parts: Buffer[]): void {
  let pending = '{'; // text not yet encoded
  let isFirst = true;
  for (const key of Object.keys(value)) {
    const member = value[key];
    const head = `${isFirst ? '' : ','}${JSON.stringify(key)}:`;
    if (depth > 1 && isPlainObject(member)) {
      parts.push(Buffer.from(pending + head, 'utf8'));
      pending = '';
      isFirst = false;
      appendJson(member, depth - 1, parts);
      continue;
    }
    // undefined, a function, a symbol (or a toJSON giving undefined): left out, as JSON.stringify does.
    const text = JSON.stringify(member);
    if (text === undefined) continue;
    parts.push(Buffer.from(pending + head + text, 'utf8'));
    pending = '';
    isFirst = false;
  }
  parts.push(Buffer.from(pending + '}', 'utf8'));
}

/**
 * `Buffer.from(JSON.stringify(value), 'utf8')`, byte for byte, at a third of its cost for a
 * design. One character beyond Latin-1 anywhere (a model note's '−' or 'Δ') makes V8 build the
 * whole JSON text as a two-byte string, whose UTF-8 encoding is several times slower than a
 * one-byte string's; encoding the members of the top `SPLIT_DEPTH` object levels one by one
 * confines that to the members that hold such characters. Throws where JSON.stringify throws.
 */
export function jsonUtf8(value: unknown): Buffer {
  if (!isPlainObject(value)) {
    const text = JSON.stringify(value);
    if (text === undefined) throw new TypeError('jsonUtf8: the value has no JSON text');
    return Buffer.from(text, 'utf8');
  }
  const parts: Buffer[] = [];
  appendJson(value, SPLIT_DEPTH, parts);
  return Buffer.concat(parts);
}
