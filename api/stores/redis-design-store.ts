import {
  designContentJson,
  revisionFromJson,
  type DesignContent,
  type DesignRevisionRecord,
  type DesignStore,
  type RevisionSummary,
} from './design-store.js';
import { redisStoreConnection, type RedisStoreOptions } from './redis-store-connection.js';
import { StoreUnavailableError } from './store-unavailable-error.js';

/** Options of the store (see RedisStoreOptions). */
export type RedisDesignStoreOptions = RedisStoreOptions;

/**
 * Appends one revision and its summary in one atomic step (a Lua script runs alone on the
 * server), so two concurrent appends get consecutive numbers and the two lists never drift.
 * ARGV[3] = 'new' refuses an existing key (create), 'next' refuses a missing one (append).
 * Returns the new revision number, or 0 when refused.
 */
const APPEND_SCRIPT = `
local exists = redis.call('EXISTS', KEYS[1])
if (ARGV[3] == 'new' and exists == 1) or (ARGV[3] == 'next' and exists == 0) then return 0 end
local revision = redis.call('RPUSH', KEYS[1], ARGV[1])
redis.call('RPUSH', KEYS[2], ARGV[2])
return revision
`;

/** The script as an ioredis command: EVALSHA, loading the script again if Redis lost it. */
interface WithAppend {
  icdAppendRevision(
    revisions: string,
    summaries: string,
    contentJson: Buffer,
    summary: string,
    mode: 'new' | 'next',
  ): Promise<number>;
}

/**
 * A DesignStore on Redis: per design, one list of revision contents (JSON) and one list of their
 * summaries, keyed under a `{id}` hash tag so both live in one cluster slot. A revision's number
 * is its list position + 1, so stored revisions are never rewritten. Connection failures and
 * timeouts reject with StoreUnavailableError (the API answers 503).
 */
export function createRedisDesignStore(options: RedisDesignStoreOptions): DesignStore {
  const connection = redisStoreConnection({ ...options, storeName: 'design store' });
  const { redis, guarded, keyPrefix } = connection;
  // By its SHA-1 (EVALSHA): EVAL sent the script's text with every revision, and Redis hashed it.
  redis.defineCommand('icdAppendRevision', { numberOfKeys: 2, lua: APPEND_SCRIPT });
  const scripted = redis as unknown as WithAppend;
  // The tenant is part of every key: another tenant's id names keys that do not exist.
  const keys = (tenant: string, id: string) => ({
    revisions: `${keyPrefix}:tenant:${tenant}:design:{${id}}:revisions`,
    summaries: `${keyPrefix}:tenant:${tenant}:design:{${id}}:summaries`,
  });

  async function append(tenant: string, id: string, content: DesignContent, mode: 'new' | 'next') {
    const summary = JSON.stringify({
      createdAt: content.meta.createdAt,
      inputHash: content.meta.inputHash,
    });
    const { revisions, summaries } = keys(tenant, id);
    const contentJson = designContentJson(content);
    const revision = await guarded(() =>
      scripted.icdAppendRevision(revisions, summaries, contentJson, summary, mode),
    );
    return revision === 0 ? undefined : { id, revision, ...content, contentJson };
  }

  const parse = (
    id: string,
    revision: number,
    json: Buffer | null,
  ): DesignRevisionRecord | undefined =>
    json === null ? undefined : revisionFromJson(id, revision, json);

  return {
    async create(tenant, content) {
      // A random UUID never repeats in practice; the script still refuses to overwrite one.
      for (;;) {
        const record = await append(tenant, crypto.randomUUID(), content, 'new');
        if (record) return record;
      }
    },
    appendRevision: (tenant, id, content) => append(tenant, id, content, 'next'),
    async latest(tenant, id) {
      const key = keys(tenant, id).revisions;
      // MULTI runs both reads at one instant, so the count and the last element agree.
      const replies = await guarded(() => redis.multi().llen(key).lindexBuffer(key, -1).exec());
      const [[lengthError, length], [jsonError, json]] = (replies ?? [[null], [null]]) as [
        [Error | null, number],
        [Error | null, Buffer | null],
      ];
      const failed = lengthError ?? jsonError;
      if (failed) throw new StoreUnavailableError(`design store: ${failed.message}`);
      return parse(id, length, json);
    },
    async revision(tenant, id, revision) {
      if (!Number.isInteger(revision) || revision < 1) return undefined;
      const json = await guarded(() =>
        redis.lindexBuffer(keys(tenant, id).revisions, revision - 1),
      );
      return parse(id, revision, json);
    },
    async listRevisions(tenant, id) {
      const items = await guarded(() => redis.lrange(keys(tenant, id).summaries, 0, -1));
      if (items.length === 0) return undefined;
      return items.map((json, index): RevisionSummary => ({
        revision: index + 1,
        ...(JSON.parse(json) as Omit<RevisionSummary, 'revision'>),
      }));
    },
    isReady: connection.isReady,
    close: connection.close,
  };
}
