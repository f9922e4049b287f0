import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../api/config.js';

describe('loadConfig', () => {
  it('loadConfig({}) gives the documented defaults and no Redis', () => {
    expect(loadConfig({})).toEqual({
      port: 8080,
      host: '127.0.0.1',
      bodyLimitBytes: 1024 * 1024,
      jobSizeLimits: { sweep: 100_000, 'core-search': 1_000_000, tolerance: 1_000_000 },
      inProcessConcurrency: 1,
      jobChunkTimeoutS: 300,
      retryAfterS: 5,
      queueName: 'converter-jobs',
      idempotencyTtlS: 86_400,
      rateLimitPerMinute: 600,
      jobsPerTenantMax: 10,
      logLevel: 'info',
      apiProcesses: 1,
    });
  });

  it('loadConfig reads every variable it knows', () => {
    const config = loadConfig({
      PORT: '9000',
      HOST: '0.0.0.0',
      REDIS_URL: 'redis://127.0.0.1:6390/2',
      BODY_LIMIT_BYTES: '2048',
      JOB_SIZE_LIMIT_SWEEP: '500',
      IN_PROCESS_CONCURRENCY: '3',
      QUEUE_NAME: 'designs-a',
      JOB_CHUNK_TIMEOUT_S: '60',
      LOG_LEVEL: 'warn',
    });
    expect(config).toMatchObject({
      port: 9000,
      host: '0.0.0.0',
      redisUrl: 'redis://127.0.0.1:6390/2',
      bodyLimitBytes: 2048,
      jobSizeLimits: { sweep: 500, 'core-search': 1_000_000, tolerance: 1_000_000 },
      inProcessConcurrency: 3,
      queueName: 'designs-a',
      jobChunkTimeoutS: 60,
      logLevel: 'warn',
    });
  });

  it('loadConfig with bad values throws ConfigError naming each variable', () => {
    const load = () =>
      loadConfig({
        PORT: 'eighty',
        JOB_SIZE_LIMIT_SWEEP: '0',
        REDIS_URL: 'http://x',
        LOG_LEVEL: 'loud',
        JOB_CHUNK_TIMEOUT_S: '0',
      });
    expect(load).toThrow(ConfigError);
    expect(load).toThrowErrorMatchingInlineSnapshot(
      `[ConfigError: invalid environment: PORT="eighty": must be a whole number; REDIS_URL="http://x": must be a redis:// or rediss:// URL; JOB_SIZE_LIMIT_SWEEP="0": must be at least 1; JOB_CHUNK_TIMEOUT_S="0": must be at least 1; LOG_LEVEL="loud": must be one of trace, debug, info, warn, error, fatal, silent]`,
    );
  });

  it("JOB_SIZE_LIMIT sets every kind without a variable of its own; a kind's own wins", () => {
    expect(loadConfig({ JOB_SIZE_LIMIT: '2000' }).jobSizeLimits).toEqual({
      sweep: 2000,
      'core-search': 2000,
      tolerance: 2000,
    });
    expect(
      loadConfig({ JOB_SIZE_LIMIT: '2000', JOB_SIZE_LIMIT_SWEEP: '30' }).jobSizeLimits,
    ).toEqual({ sweep: 30, 'core-search': 2000, tolerance: 2000 });
  });

  it('loadConfig names the replacement of a retired variable (SWEEP_POINT_LIMIT)', () => {
    expect(() => loadConfig({ SWEEP_POINT_LIMIT: '500' })).toThrowErrorMatchingInlineSnapshot(
      `[ConfigError: invalid environment: SWEEP_POINT_LIMIT is no longer read: set JOB_SIZE_LIMIT_SWEEP instead]`,
    );
  });

  it('API_PROCESSES above 1 needs REDIS_URL: the embedded backend is per process', () => {
    expect(
      loadConfig({ API_PROCESSES: '2', REDIS_URL: 'redis://127.0.0.1:6379' }).apiProcesses,
    ).toBe(2);
    expect(loadConfig({ API_PROCESSES: '1' }).apiProcesses).toBe(1);
    expect(() => loadConfig({ API_PROCESSES: '2' })).toThrowErrorMatchingInlineSnapshot(
      `[ConfigError: invalid environment: API_PROCESSES="2": more than one API process needs REDIS_URL (the embedded backend keeps designs, keys and jobs in each process's own memory, so they would not be found through the other processes); set REDIS_URL or run one process]`,
    );
    expect(() =>
      loadConfig({ API_PROCESSES: '0', REDIS_URL: 'redis://127.0.0.1:6379' }),
    ).toThrowErrorMatchingInlineSnapshot(
      `[ConfigError: invalid environment: API_PROCESSES="0": must be at least 1]`,
    );
    expect(() =>
      loadConfig({ API_PROCESSES: 'auto', REDIS_URL: 'redis://127.0.0.1:6379' }),
    ).toThrowError(/API_PROCESSES="auto": must be a whole number/);
    expect(() =>
      loadConfig({ API_PROCESSES: '65', REDIS_URL: 'redis://127.0.0.1:6379' }),
    ).toThrowError(/API_PROCESSES="65": must be at most 64/);
  });

  it('loadConfig treats an empty variable as unset', () => {
    expect(loadConfig({ PORT: '', REDIS_URL: '' }).port).toBe(8080);
  });
});
