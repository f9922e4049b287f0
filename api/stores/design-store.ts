import type { ResultMeta, Spec } from '../../solvers/index.js';
import { jsonUtf8 } from '../http/json-utf8.js';
import type { DesignAnswer } from '../schemas/design-answer-schema.js';

/**
 * What one revision holds: the parsed spec, the engine's design for it, and its provenance. The
 * routes store the design without its corners' waveforms (api/designs/waveforms.ts), which are
 * recomputed when asked for; revisions stored before that hold them. A store keeps whatever it
 * is given.
 */
export interface DesignContent {
  spec: Spec;
  design: DesignAnswer;
  meta: ResultMeta;
  /**
   * Its JSON text in UTF-8 when already made (designContentJson's bytes: an encodedContent, a
   * record's own): a store keeps these bytes instead of serializing the content again.
   */
  contentJson?: Buffer;
}

/**
 * One immutable revision of a stored design. Revisions count from 1. `contentJson` is the
 * content's JSON text as stored, in UTF-8 (designContentJson: spec, design, meta), so a response
 * embeds those bytes instead of serializing and encoding the same 50 kB again
 * (api/designs/design-view.ts). Read only: the memory store hands out the very bytes it keeps.
 */
export interface DesignRevisionRecord extends DesignContent {
  id: string;
  revision: number;
  contentJson: Buffer;
}

/**
 * The JSON text a store keeps for one revision, `{"spec":…,"design":…,"meta":…}` in that order,
 * encoded once as UTF-8 (what Redis and the HTTP answer both carry; a Buffer also lives outside
 * the JavaScript heap, which the garbage collector then need not copy or mark). Its numbers are
 * finite without a walk of its own here: the spec passed SpecSchema (finite numbers only),
 * designConverter has already checked every number of the design (a NaN or an infinity throws
 * there), and meta holds strings. Encoded member by member (jsonUtf8): a model note's character
 * beyond Latin-1 would otherwise make the whole 100 kB a two-byte string, slow to encode.
 */
export function designContentJson(content: DesignContent): Buffer {
  return jsonUtf8({ spec: content.spec, design: content.design, meta: content.meta });
}

/**
 * `content` serialized now (designContentJson), its design read back from those bytes only if
 * it is asked for (a route stores and answers the bytes alone). The route lets go of the
 * engine's design as it hands this to a store: a design held while Redis answers was copied by
 * every young-generation collection that met it, and the design with its waveforms (which the
 * evaluation's result holds) even more so.
 */
export function encodedContent(content: DesignContent): DesignContent & { contentJson: Buffer } {
  const contentJson = designContentJson(content);
  const { spec, meta } = content;
  let design: DesignAnswer | undefined;
  return {
    spec,
    meta,
    get design() {
      return (design ??= (JSON.parse(contentJson.toString('utf8')) as DesignContent).design);
    },
    contentJson,
  };
}

/**
 * The record of revision `revision` of design `id` just stored from `content` as `contentJson`:
 * its spec, design and meta are the content's, read through (never copied out: a content's
 * design may be read back from its bytes only when asked for, see encodedContent).
 */
export function storedRecord(
  id: string,
  revision: number,
  content: DesignContent,
  contentJson: Buffer,
): DesignRevisionRecord {
  return {
    id,
    revision,
    get spec() {
      return content.spec;
    },
    get design() {
      return content.design;
    },
    get meta() {
      return content.meta;
    },
    contentJson,
  };
}

/**
 * The record of a stored revision read back from its JSON bytes. The content is parsed when one
 * of `spec`, `design` or `meta` is first read, once: an answer needs only the bytes
 * (designViewJson), and parsing 100 kB of JSON costs about as much as serializing it.
 */
export function revisionFromJson(id: string, revision: number, json: Buffer): DesignRevisionRecord {
  let content: DesignContent | undefined;
  const parsed = () => (content ??= JSON.parse(json.toString('utf8')) as DesignContent);
  return {
    id,
    revision,
    get spec() {
      return parsed().spec;
    },
    get design() {
      return parsed().design;
    },
    get meta() {
      return parsed().meta;
    },
    contentJson: json,
  };
}

/** The listing entry of one revision. */
export interface RevisionSummary {
  revision: number;
  createdAt: string;
  inputHash: string;
}

/**
 * Where designs live, each owned by one tenant: every method takes the caller's tenant, and a
 * design of another tenant is exactly as absent as one that never existed. Revisions are
 * immutable and numbered 1, 2, 3… in append order; two concurrent appends get two different
 * numbers. Every method rejects with StoreUnavailableError
 * when the backing store cannot be reached; `undefined` means no such design or revision.
 */
export interface DesignStore {
  /** Stores revision 1 of a new design under a fresh random id. */
  create(tenant: string, content: DesignContent): Promise<DesignRevisionRecord>;
  /** Appends the next revision; undefined when the design does not exist. */
  appendRevision(
    tenant: string,
    id: string,
    content: DesignContent,
  ): Promise<DesignRevisionRecord | undefined>;
  latest(tenant: string, id: string): Promise<DesignRevisionRecord | undefined>;
  revision(tenant: string, id: string, revision: number): Promise<DesignRevisionRecord | undefined>;
  /** Every revision in order; undefined when the design does not exist. */
  listRevisions(tenant: string, id: string): Promise<RevisionSummary[] | undefined>;
  /** True when the store can serve requests now. */
  isReady(): Promise<boolean>;
  close(): Promise<void>;
}
