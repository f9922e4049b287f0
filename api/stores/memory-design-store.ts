import type { DesignContent, DesignRevisionRecord, DesignStore } from './design-store.js';

function jsonCopy<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

/**
 * A DesignStore in this process's memory: the embedded default when no REDIS_URL is set.
 * Contents are copied in and out through JSON, as the Redis store stores them, so both return
 * the same values (-0 reads back as 0) and no caller can change a stored revision.
 */
export function createMemoryDesignStore(): DesignStore {
  const designs = new Map<string, DesignContent[]>();
  let isClosed = false;

  const record = (id: string, revisions: DesignContent[], revision: number) => {
    const content = revisions[revision - 1];
    return content && { id, revision, ...jsonCopy(content) };
  };

  return {
    async create(content) {
      const id = crypto.randomUUID();
      designs.set(id, [jsonCopy(content)]);
      return { id, revision: 1, ...jsonCopy(content) };
    },
    async appendRevision(id, content) {
      const revisions = designs.get(id);
      if (!revisions) return undefined;
      revisions.push(jsonCopy(content));
      return { id, revision: revisions.length, ...jsonCopy(content) };
    },
    async latest(id) {
      const revisions = designs.get(id);
      return revisions && record(id, revisions, revisions.length);
    },
    async revision(id, revision): Promise<DesignRevisionRecord | undefined> {
      const revisions = designs.get(id);
      return revisions && Number.isInteger(revision) && revision >= 1
        ? record(id, revisions, revision)
        : undefined;
    },
    async listRevisions(id) {
      return designs.get(id)?.map((content, index) => ({
        revision: index + 1,
        createdAt: content.meta.createdAt,
        inputHash: content.meta.inputHash,
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
