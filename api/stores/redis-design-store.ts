import {
  designContentJson,
  revisionFromJson,
  storedRecord,
  type DesignContent,
  type DesignRevisionRecord,
  type DesignStore,
  type RevisionSummary,
} from './design-store.js';
import { redisStoreConnection, type RedisStoreOptions } from './redis-store-connection.js';
import { StoreUnavailableError } from './store-unavailable-error.js';

/** Options of the store (see RedisStoreOptions). */
export type RedisDesignStoreOptions = RedisStoreOptions;

/** The Redis keys of one design of one tenant. */
interface DesignKeys {
  /** The list of its revisions' contents (JSON, UTF-8), revision n at index n − 1. */
  revisions: string;
  /** The list of its revisions' summaries (JSON), in the same order. */
  summaries: string;
  /** Where create() puts a new design's two lists until it renames them into place. */
  stagedRevisions: string;
  stagedSummaries: string;
}

/** One reply of a MULTI's EXEC as ioredis gives it: the command's error, or its result. */
type ExecReply = [Error | null, unknown];

/**
 * The result of the command at `index` of an EXEC's replies. Rejects StoreUnavailableError when
 * the transaction did not run (EXEC answered nothing) or that command failed.
 */
function execResult(replies: ExecReply[] | null, index: number): unknown {
  const [error, result] = replies?.[index] ?? [new Error('the transaction did not run'), null];
  if (error) throw new StoreUnavailableError(`design store: ${error.message}`);
  return result;
}

/**
 * A DesignStore on Redis: per design, one list of revision contents (JSON) and one list of their
 * summaries, keyed under a `{id}` hash tag so that all of a design's keys live in one cluster
 * slot. A revision's number is its list position + 1, so stored revisions are never rewritten.
 * Connection failures and timeouts reject with StoreUnavailableError (the API answers 503).
 *
 * Both writes are one MULTI/EXEC each (one round trip; the commands run alone on the server, so
 * two concurrent appends get consecutive numbers and the two lists never drift), of plain
 * commands only: a Lua script that received the 120 kB content as an argument cost Redis
 * three to four times the CPU of storing it (the argument is copied into Lua and back).
 * create() writes the new lists under staging keys and renames them into place with RENAMENX,
 * which refuses an existing design (a repeated UUID); appendRevision() appends with RPUSHX,
 * which refuses a missing one.
 */
export function createRedisDesignStore(options: RedisDesignStoreOptions): DesignStore {
  const connection = redisStoreConnection({ ...options, storeName: 'design store' });
  const { redis, guarded, keyPrefix } = connection;
  // The tenant is part of every key: another tenant's id names keys that do not exist.
  const keys = (tenant: string, id: string): DesignKeys => {
    const design = `${keyPrefix}:tenant:${tenant}:design:{${id}}`;
    return {
      revisions: `${design}:revisions`,
      summaries: `${design}:summaries`,
      stagedRevisions: `${design}:staged-revisions`,
      stagedSummaries: `${design}:staged-summaries`,
    };
  };
  const summaryJson = (content: DesignContent) =>
    JSON.stringify({ createdAt: content.meta.createdAt, inputHash: content.meta.inputHash });

  /**
   * Stores `content` as revision 1 of design `id`: true, or false when the design exists. The
   * two lists appear together or not at all; the staging keys never outlive the transaction.
   */
  async function createAt(tenant: string, id: string, content: DesignContent, json: Buffer) {
    const k = keys(tenant, id);
    const replies = await guarded(() =>
      redis
        .multi()
        .rpush(k.stagedRevisions, json)
        .rpush(k.stagedSummaries, summaryJson(content))
        .renamenx(k.stagedRevisions, k.revisions)
        .renamenx(k.stagedSummaries, k.summaries)
        .del(k.stagedRevisions, k.stagedSummaries)
        .exec(),
    );
    // Both lists exist or neither, so both renames succeed or both are refused.
    return execResult(replies, 2) === 1;
  }

  const parse = (
    id: string,
    revision: number,
    json: Buffer | null,
  ): DesignRevisionRecord | undefined =>
    json === null ? undefined : revisionFromJson(id, revision, json);

  return {
    async create(tenant, content) {
      const contentJson = content.contentJson ?? designContentJson(content);
      // A random UUID never repeats in practice; the rename still refuses to overwrite one.
      for (;;) {
        const id = crypto.randomUUID();
        if (await createAt(tenant, id, content, contentJson)) {
          return storedRecord(id, 1, content, contentJson);
        }
      }
    },
    async appendRevision(tenant, id, content) {
      const { revisions, summaries } = keys(tenant, id);
      const contentJson = content.contentJson ?? designContentJson(content);
      const replies = await guarded(() =>
        redis.multi().rpushx(revisions, contentJson).rpushx(summaries, summaryJson(content)).exec(),
      );
      // RPUSHX answers the list's new length, or 0 when there is no such design.
      const revision = execResult(replies, 0) as number;
      return revision === 0 ? undefined : storedRecord(id, revision, content, contentJson);
    },
    async latest(tenant, id) {
      const key = keys(tenant, id).revisions;
      // MULTI runs both reads at one instant, so the count and the last element agree.
      const replies = await guarded(() => redis.multi().llen(key).lindexBuffer(key, -1).exec());
      const length = execResult(replies, 0) as number;
      return parse(id, length, execResult(replies, 1) as Buffer | null);
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
