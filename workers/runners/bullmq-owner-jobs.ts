import type { Redis } from 'ioredis';

/**
 * Each owner's unfinished jobs on the BullMQ backend, for the per-owner job quota. An owner has
 * a set of job ids beside BullMQ's keys (`ownerJobsKey`); an id enters it when the job is
 * admitted, before its flow is added, together with an admission key (`admissionKey`, with a
 * time to live) that holds the place until the flow exists. Counting and admitting are one Lua
 * script, so no two submissions, from one process or several, can both take the last place.
 */

/** The key of the set of an owner's job ids (those not yet seen finished), beside BullMQ's own. */
export function ownerJobsKey(queueName: string, owner: string): string {
  return `bull:${queueName}:owner-jobs:${encodeURIComponent(owner)}`;
}

/** The key that holds an admitted job's place while its flow is being added. */
export function admissionKey(queueName: string, id: string): string {
  return `bull:${queueName}:owner-admission:${id}`;
}

// Counts an owner's unfinished jobs and forgets the finished ones, in one step. KEYS: the
// owner's set of job ids, the queue's completed and failed sets. ARGV[1]: the prefix of a job's
// hash key; ARGV[2]: the prefix of an admission key. A job is unfinished while its hash exists
// and it is neither completed nor failed (a cancelled waiting job is removed; a finished one
// may have been removed as old), or, before its hash exists, while its admission holds.
const COUNT_UNFINISHED = `
local count = 0
for _, id in ipairs(redis.call('SMEMBERS', KEYS[1])) do
  local live
  if redis.call('EXISTS', ARGV[1] .. id) == 1 then
    live = not redis.call('ZSCORE', KEYS[2], id) and not redis.call('ZSCORE', KEYS[3], id)
  else
    live = redis.call('EXISTS', ARGV[2] .. id) == 1
  end
  if live then
    count = count + 1
  else
    redis.call('SREM', KEYS[1], id)
  end
end
`;

const COUNT_LUA = `${COUNT_UNFINISHED}
return count
`;

// The count, then, below the limit (ARGV[4]; negative for none), the new id (ARGV[3]) joins the
// set (kept ARGV[6] ms) and its admission key is set for ARGV[5] ms. Answers {admitted, count}.
const ADMIT_LUA = `${COUNT_UNFINISHED}
local limit = tonumber(ARGV[4])
if limit >= 0 and count >= limit then
  return {0, count}
end
redis.call('SADD', KEYS[1], ARGV[3])
redis.call('PEXPIRE', KEYS[1], ARGV[6])
redis.call('SET', ARGV[2] .. ARGV[3], '1', 'PX', ARGV[5])
return {1, count}
`;

// Gives an admitted id's place back after its flow failed to be added: the id leaves the set
// unless its job exists after all (written before the failure was seen), and the admission
// key goes. KEYS[1]: the owner's set; ARGV: the job's hash key, its admission key, its id.
const RELEASE_LUA = `
if redis.call('EXISTS', ARGV[1]) == 0 then
  redis.call('SREM', KEYS[1], ARGV[3])
end
redis.call('DEL', ARGV[2])
return 1
`;

/** The keys the scripts read for `owner` on `queueName`. */
function countKeys(queueName: string, owner: string): [string, string, string] {
  return [
    ownerJobsKey(queueName, owner),
    `bull:${queueName}:completed`,
    `bull:${queueName}:failed`,
  ];
}

const jobKeyPrefix = (queueName: string) => `bull:${queueName}:`;
const admissionPrefix = (queueName: string) => admissionKey(queueName, '');

/** The owner's unfinished jobs (admitted and not yet finished); O(the owner's set). */
export async function countOwnerJobs(
  client: Redis,
  queueName: string,
  owner: string,
): Promise<number> {
  const count = await client.eval(
    COUNT_LUA,
    3,
    ...countKeys(queueName, owner),
    jobKeyPrefix(queueName),
    admissionPrefix(queueName),
  );
  return Number(count);
}

/** How an admission went: admitted or not, and the owner's unfinished jobs before it. */
export interface Admission {
  admitted: boolean;
  unfinished: number;
}

/**
 * Admits job `id` of `owner` if the owner has fewer than `limit` unfinished jobs (any number
 * when `limit` is undefined), in one step with the count. The place is held `holdMs` for the
 * flow to be added; the set is kept `keepMs`.
 */
export async function admitOwnerJob(
  client: Redis,
  queueName: string,
  owner: string,
  id: string,
  options: { limit: number | undefined; holdMs: number; keepMs: number },
): Promise<Admission> {
  const answer = (await client.eval(
    ADMIT_LUA,
    3,
    ...countKeys(queueName, owner),
    jobKeyPrefix(queueName),
    admissionPrefix(queueName),
    id,
    options.limit ?? -1,
    Math.ceil(options.holdMs),
    Math.ceil(options.keepMs),
  )) as [number, number];
  return { admitted: answer[0] === 1, unfinished: Number(answer[1]) };
}

/** Job `id`'s flow exists: its hash now keeps its place, so the admission key can go. */
export async function confirmOwnerJob(client: Redis, queueName: string, id: string): Promise<void> {
  await client.del(admissionKey(queueName, id));
}

/** Job `id`'s flow could not be added: its place is given back (see RELEASE_LUA). */
export async function releaseOwnerJob(
  client: Redis,
  queueName: string,
  owner: string,
  id: string,
): Promise<void> {
  await client.eval(
    RELEASE_LUA,
    1,
    ownerJobsKey(queueName, owner),
    `${jobKeyPrefix(queueName)}${id}`,
    admissionKey(queueName, id),
    id,
  );
}
