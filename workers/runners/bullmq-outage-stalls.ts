import type { Redis } from 'ioredis';

// Gives back the stall a Redis outage cost a job that its worker kept running through it.
// KEYS: the job's hash, its lock. ARGV[1]: the lock token of the worker's run. When the lock
// is no longer that run's (it expired while Redis was down), the stall check has counted, or
// will count, one stall against the job (`stc` in its hash, which BullMQ compares with
// maxStalledCount); it is taken back here, once per run: KEYS[3] remembers the run's credit
// for an hour (a command resent after a reconnection must not give a second one). A job that
// is gone is left alone. Answers 1 when the run's lock is lost (a stall given back, now or
// before).
const CREDIT_LUA = `
if redis.call('EXISTS', KEYS[1]) == 0 then
  return 0
end
if redis.call('GET', KEYS[2]) == ARGV[1] then
  return 0
end
if redis.call('SET', KEYS[3], '1', 'NX', 'PX', 3600000) then
  redis.call('HINCRBY', KEYS[1], 'stc', -1)
end
return 1
`;

/**
 * Called by a worker that ran job `id` (with lock `token`) through a Redis outage, once it is
 * connected again: if the run lost its lock, the stall that the loss causes is not counted
 * against the job (BULLMQ_SETTINGS.maxStalledCount counts workers that stopped, not outages).
 * Resolves to true when the run's lock is lost for good (its stall given back, once per run).
 */
export async function creditOutageStall(
  client: Redis,
  queueName: string,
  id: string,
  token: string,
): Promise<boolean> {
  const jobKey = `bull:${queueName}:${id}`;
  const creditKey = `${jobKey}:outage-credit:${token}`;
  return (await client.eval(CREDIT_LUA, 3, jobKey, `${jobKey}:lock`, creditKey, token)) === 1;
}
