/**
 * Memo tables keyed by object identity (a duty's windings, a build's turns, a wire), and the
 * scope that keeps one design's entries out of the process's lasting tables.
 *
 * Why a scope: a module-level WeakMap lives in V8's old generation, and a young-generation
 * collection (scavenge) keeps every value written into it since the last one, whether or not
 * its key still lives (the value's slot is remembered as an old-to-new pointer; only the key is
 * weak). An entry whose value reaches its own key, or another table's key, survives a second
 * scavenge and is promoted, and then stays until a full mark-compact. The design of one spec
 * made about 50 kB of such entries (spectra, stacks, windings' currents): with `designConverter`
 * alone in a loop, every scavenge copied about 0.6 MB and promoted about 0.55 MB, which grew the
 * old generation and brought mark-compacts every few seconds under load (issue 6). Inside
 * {@link withScopedMemos} the entries go into plain Maps made for that call and dropped with
 * it: young objects that die young. Outside one (core search, sweeps, tolerance runs) the
 * lasting WeakMaps serve as before, so evaluations that share a duty or a build across calls
 * still find each other's entries. A lookup in a scope also reads the lasting table (catalog
 * objects a search put there). Scopes only decide where entries are kept: a memo's value is
 * the same whether it was found or computed, so no number depends on them.
 */
export class ObjectMemo<K extends object, V> {
  private readonly lasting = new WeakMap<K, V>();
  private scoped: Map<K, V> | undefined = undefined;

  constructor() {
    MEMOS.push(this as ObjectMemo<object, unknown>);
  }

  /** The value kept for `key`, or undefined. */
  get(key: K): V | undefined {
    if (this.scoped !== undefined) {
      const value = this.scoped.get(key);
      if (value !== undefined) return value;
    }
    return this.lasting.get(key);
  }

  /** Keeps `value` for `key`: in the current scope's table inside one, else in the lasting one. */
  set(key: K, value: V): void {
    if (scopeDepth === 0) {
      this.lasting.set(key, value);
      return;
    }
    if (this.scoped === undefined) this.scoped = new Map();
    this.scoped.set(key, value);
  }

  /** Drops the scope's table (the outermost scope ended). */
  endScope(): void {
    this.scoped = undefined;
  }
}

/** Every memo made, to drop their scoped tables when the outermost scope ends. */
const MEMOS: Array<ObjectMemo<object, unknown>> = [];
let scopeDepth = 0;

/**
 * Runs `run` with the memos' new entries kept for this call only (nested calls share the
 * outermost call's tables); they are dropped when it returns or throws.
 */
export function withScopedMemos<T>(run: () => T): T {
  scopeDepth += 1;
  try {
    return run();
  } finally {
    scopeDepth -= 1;
    if (scopeDepth === 0) {
      for (const memo of MEMOS) memo.endScope();
    }
  }
}
