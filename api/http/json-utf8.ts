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

/**
 * Appends the JSON text of `value` to `parts`, member by member down to `depth` levels. A
 * member's text is a part of its own, never joined to the punctuation before it: the join would
 * be a rope that encoding flattens, a copy of up to 100 kB.
 */
function appendJson(value: Record<string, unknown>, depth: number, parts: string[]): void {
  let pending = '{'; // punctuation and keys not yet appended
  let isFirst = true;
  for (const key of Object.keys(value)) {
    const member = value[key];
    const head = `${isFirst ? '' : ','}${JSON.stringify(key)}:`;
    if (depth > 1 && isPlainObject(member)) {
      parts.push(pending + head);
      pending = '';
      isFirst = false;
      appendJson(member, depth - 1, parts);
      continue;
    }
    // undefined, a function, a symbol (or a toJSON giving undefined): left out, as JSON.stringify does.
    const text = JSON.stringify(member);
    if (text === undefined) continue;
    parts.push(pending + head, text);
    pending = '';
    isFirst = false;
  }
  parts.push(pending + '}');
}

/**
 * `Buffer.from(JSON.stringify(value), 'utf8')`, byte for byte, at a third of its cost for a
 * design. One character beyond Latin-1 anywhere (a model note's '−' or 'Δ') makes V8 build the
 * whole JSON text as a two-byte string, whose UTF-8 encoding is several times slower than a
 * one-byte string's; encoding the members of the top `SPLIT_DEPTH` object levels one by one
 * confines that to the members that hold such characters. The parts are written into one
 * buffer of the exact size: a buffer per part and their concatenation were two more 100 kB
 * allocations a design (fresh memory the C library may have to fault in, and external memory
 * that hastens V8's garbage collection). Throws where JSON.stringify throws.
 */
export function jsonUtf8(value: unknown): Buffer {
  if (!isPlainObject(value)) {
    const text = JSON.stringify(value);
    if (text === undefined) throw new TypeError('jsonUtf8: the value has no JSON text');
    return Buffer.from(text, 'utf8');
  }
  const parts: string[] = [];
  appendJson(value, SPLIT_DEPTH, parts);
  let length = 0;
  for (const part of parts) length += Buffer.byteLength(part, 'utf8');
  const bytes = Buffer.allocUnsafe(length);
  let offset = 0;
  for (const part of parts) offset += bytes.write(part, offset, 'utf8');
  return bytes;
}
