import type { Design, ResultMeta, Spec } from '../../solvers/index.js';

/** What one revision holds: the parsed spec, the engine's design for it, and its provenance. */
export interface DesignContent {
  spec: Spec;
  design: Design;
  meta: ResultMeta;
}

/** One immutable revision of a stored design. Revisions count from 1. */
export interface DesignRevisionRecord extends DesignContent {
  id: string;
  revision: number;
}

/** The listing entry of one revision. */
export interface RevisionSummary {
  revision: number;
  createdAt: string;
  inputHash: string;
}

/**
 * Where designs live. Revisions are immutable and numbered 1, 2, 3… in append order; two
 * concurrent appends get two different numbers. Every method rejects with StoreUnavailableError
 * when the backing store cannot be reached; `undefined` means no such design or revision.
 */
export interface DesignStore {
  /** Stores revision 1 of a new design under a fresh random id. */
  create(content: DesignContent): Promise<DesignRevisionRecord>;
  /** Appends the next revision; undefined when the design does not exist. */
  appendRevision(id: string, content: DesignContent): Promise<DesignRevisionRecord | undefined>;
  latest(id: string): Promise<DesignRevisionRecord | undefined>;
  revision(id: string, revision: number): Promise<DesignRevisionRecord | undefined>;
  /** Every revision in order; undefined when the design does not exist. */
  listRevisions(id: string): Promise<RevisionSummary[] | undefined>;
  /** True when the store can serve requests now. */
  isReady(): Promise<boolean>;
  close(): Promise<void>;
}
