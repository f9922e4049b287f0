/** The longest wait between two reconnection attempts to Redis, ms. */
export const RECONNECT_MAX_DELAY_MS = 1_000;

/**
 * The ioredis `retryStrategy` every connection of the service uses (API stores, job producer,
 * workers): 50 ms, 100 ms, 200 ms … doubling up to RECONNECT_MAX_DELAY_MS, and never giving up.
 * So after an outage every process is connected again within about a second of Redis answering
 * (ioredis 6's own default waits up to 5 s between attempts).
 */
export function reconnectDelayMs(times: number): number {
  const attempt = Math.max(1, Math.floor(times));
  return Math.min(50 * 2 ** Math.min(attempt - 1, 30), RECONNECT_MAX_DELAY_MS);
}
