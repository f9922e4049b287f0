import {
  designContentJson,
  revisionFromJson,
  storedRecord,
  type DesignContent,
  type DesignRevisionRecord,
  type DesignStore,
} from './design-store.js';

/** A stored revision: its JSON text in UTF-8 (so nobody can change it) and what listing needs. */
interface StoredRevision {
  json: Buffer;
  createdAt: string;
  inputHash: string;
}

function stored(content: DesignContent): StoredRevision {
  return {
    json: content.contentJson ?? designContentJson(content),
    createdAt: content.meta.createdAt,
    inputHash: content.meta.inputHash,
  };
}

/**
 * A DesignStore in this process's memory: the embedded default when no REDIS_URL is set.
 * Revisions are kept as JSON text, as the Redis store keeps them, so reads return the same
 * values from both and no caller can change a stored revision. The content handed to create
 * and appendRevision is returned as is with its JSON text (serialized once, not copied; the
 * content's own bytes when it carries them).
 */
export function createMemoryDesignStore(): DesignStore {
  // Keyed by tenant and id: another tenant's id simply is not there.
  const designs = new Map<string, StoredRevision[]>();
  const key = (tenant: string, id: string) => `${tenant}\u0000${id}`;
  let isClosed = false;

  const record = (id: string, revisions: StoredRevision[], revision: number) => {
    const content = revisions[revision - 1];
    return content && revisionFromJson(id, revision, content.json);
  };

  return {
    async create(tenant, content) {
      const id = crypto.randomUUID();
      const revision = stored(content);
      designs.set(key(tenant, id), [revision]);
      return storedRecord(id, 1, content, revision.json);
    },
    async appendRevision(tenant, id, content) {
      const revisions = designs.get(key(tenant, id));
      if (!revisions) return undefined;
      const revision = stored(content);
      revisions.push(revision);
      return storedRecord(id, revisions.length, content, revision.json);
    },
    async latest(tenant, id) {
      const revisions = designs.get(key(tenant, id));
      return revisions && record(id, revisions, revisions.length);
    },
    async revision(tenant, id, revision): Promise<DesignRevisionRecord | undefined> {
      const revisions = designs.get(key(tenant, id));
      return revisions && Number.isInteger(revision) && revision >= 1
        ? record(id, revisions, revision)
        : undefined;
    },
    async listRevisions(tenant, id) {
      return designs.get(key(tenant, id))?.map((content, index) => ({
        revision: index + 1,
        createdAt: content.createdAt,
        inputHash: content.inputHash,
      }));
    },
    async isReady() {
      return !isClosed;
    },
    async close() {
      isClosed = true;
    },
  };
}
