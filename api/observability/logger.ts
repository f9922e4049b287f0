import { pino, type DestinationStream, type Logger } from 'pino';

/** Levels LOG_LEVEL accepts, most to least verbose, and 'silent'. */
export const LOG_LEVELS = ['trace', 'debug', 'info', 'warn', 'error', 'fatal', 'silent'] as const;
export type LogLevel = (typeof LOG_LEVELS)[number];

export type { Logger };

/**
 * The process's structured logger: one JSON object per line on stdout (or `destination`), with
 * `time` as ISO 8601, `level` as its name, `service` and `pid` on every line. Request lines add
 * `requestId`, job lines `jobId` (see request-context.ts and workers/worker.ts).
 */
export function createLogger(
  options: { level?: LogLevel; service?: string; destination?: DestinationStream } = {},
): Logger {
  const { level = 'info', service = 'design-service', destination } = options;
  const settings = {
    level,
    // The pid tells apart the lines of API_PROCESSES processes writing to one stdout.
    base: { service, pid: process.pid },
    timestamp: pino.stdTimeFunctions.isoTime,
    formatters: { level: (label: string) => ({ level: label }) },
  };
  return destination === undefined ? pino(settings) : pino(settings, destination);
}

/** A logger that writes nothing: the default of createApp for tests and embedding. */
export function silentLogger(): Logger {
  return pino({ level: 'silent' });
}
