import { describe, expect, it } from 'vitest';
import { JOB_HANDLERS } from '../../workers/handlers/index.js';
import { sweepJob } from '../../workers/handlers/sweep.js';
import { createInProcessRunner } from '../../workers/runners/in-process.js';
import type { JobHandler } from '../../workers/runners/job-runner.js';
import { runnerContract } from '../contracts/runner-contract.js';
import { largeSweepRequest, smallSweepRequest } from '../helpers/sweep-requests.js';
import { waitForFinish, waitForJob } from '../helpers/wait-for-job.js';

runnerContract('in-process', async () => {
  // Counts handler calls; each contract test that asks runs a single job, so this is its attempts.
  let calls = 0;
  const countingSweep: JobHandler = (payload, context) => {
    calls += 1;
    return sweepJob(payload, context);
  };
  const runner = createInProcessRunner({ handlers: { sweep: countingSweep } });
  return { runner, attemptsOf: async () => calls, close: () => runner.close() };
});

describe('createInProcessRunner', () => {
  it('createInProcessRunner({ concurrency: 2 }) runs two jobs at once', async () => {
    const runner = createInProcessRunner({ handlers: JOB_HANDLERS, concurrency: 2 });
    const first = await runner.submit('sweep', largeSweepRequest());
    const second = await runner.submit('sweep', largeSweepRequest());
    await waitForJob(runner, first.id, (record) => record.state === 'running');
    expect((await waitForJob(runner, second.id, (r) => r.state !== 'queued')).state).toBe(
      'running',
    );
    expect((await runner.get(first.id))?.state).toBe('running');
    await runner.close();
  });

  it('createInProcessRunner({ keepFinishedJobs: 1 }) forgets the oldest finished job', async () => {
    const runner = createInProcessRunner({ handlers: JOB_HANDLERS, keepFinishedJobs: 1 });
    const first = await runner.submit('sweep', smallSweepRequest());
    await waitForFinish(runner, first.id);
    const second = await runner.submit('sweep', smallSweepRequest());
    await waitForFinish(runner, second.id);
    expect(await runner.get(first.id)).toBeUndefined();
    expect((await runner.get(second.id))?.state).toBe('completed');
    await runner.close();
  });

  it('a running sweep yields to the event loop, so other callbacks run before it ends', async () => {
    const runner = createInProcessRunner({ handlers: JOB_HANDLERS });
    const { id } = await runner.submit(
      'sweep',
      largeSweepRequest({ frequencyCount: 300, inputCount: 1 }),
    );
    await waitForJob(runner, id, (record) => record.state === 'running');
    let turns = 0;
    let isFinished = false;
    const countTurns = () => {
      turns += 1;
      if (!isFinished) setImmediate(countTurns);
    };
    setImmediate(countTurns);
    await waitForFinish(runner, id);
    isFinished = true;
    // A handler that never yields lets no immediate run until it ends; this one yields after
    // every 10 ms slice of computation, and 300 frequencies take many slices on any machine.
    // The bound is loose on purpose: the claim is that it yields, not how often.
    expect(turns).toBeGreaterThan(5);
    await runner.close();
  });

  it('a handler that throws is retried per its policy, then fails with the message', async () => {
    let calls = 0;
    const flaky: JobHandler = async () => {
      calls += 1;
      throw new Error(`attempt ${calls} broke`);
    };
    const runner = createInProcessRunner({
      handlers: { sweep: flaky },
      retryPolicies: { sweep: { attempts: 2, backoffMs: 5 } },
    });
    const { id } = await runner.submit('sweep', {});
    const record = await waitForFinish(runner, id);
    expect(record).toMatchObject({ state: 'failed', failureReason: 'attempt 2 broke' });
    expect(calls).toBe(2);
    await runner.close();
  });

  it('close() cancels queued jobs and aborts the running one; submit then rejects', async () => {
    const runner = createInProcessRunner({ handlers: JOB_HANDLERS });
    const first = await runner.submit('sweep', largeSweepRequest());
    const second = await runner.submit('sweep', smallSweepRequest());
    await waitForJob(runner, first.id, (record) => record.state === 'running');
    await runner.close();
    expect((await runner.get(first.id))?.state).toBe('cancelled');
    expect((await runner.get(second.id))?.state).toBe('cancelled');
    expect(await runner.isReady()).toBe(false);
    await expect(runner.submit('sweep', smallSweepRequest())).rejects.toThrow(/closed/);
  });
});
