import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { JOB_COMPUTATIONS, evenChunks, type AnyChunkedComputation } from '../../solvers/index.js';
import { TransientError } from '../../workers/chunks/chunk-failures.js';
import { createInProcessRunner } from '../../workers/runners/in-process.js';
import { JOB_RETRY_POLICIES } from '../../workers/runners/job-retry-policy.js';
import { runnerContract } from '../contracts/runner-contract.js';
import { largeSweepRequest, smallSweepRequest } from '../helpers/sweep-requests.js';
import { waitForFinish, waitForJob } from '../helpers/wait-for-job.js';

runnerContract('in-process', async () => {
  const runner = createInProcessRunner({ computations: JOB_COMPUTATIONS });
  return { runner, close: () => runner.close() };
});

describe('createInProcessRunner', () => {
  it('createInProcessRunner({ concurrency: 2 }) runs two jobs at once', async () => {
    const runner = createInProcessRunner({ computations: JOB_COMPUTATIONS, concurrency: 2 });
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
    const runner = createInProcessRunner({ computations: JOB_COMPUTATIONS, keepFinishedJobs: 1 });
    const first = await runner.submit('sweep', smallSweepRequest());
    await waitForFinish(runner, first.id);
    const second = await runner.submit('sweep', smallSweepRequest());
    await waitForFinish(runner, second.id);
    expect(await runner.get(first.id)).toBeUndefined();
    expect((await runner.get(second.id))?.state).toBe('completed');
    await runner.close();
  });

  it('a running sweep yields to the event loop, so other callbacks run before it ends', async () => {
    const runner = createInProcessRunner({ computations: JOB_COMPUTATIONS });
    const { id } = await runner.submit(
      'sweep',
      // One chunk, so the turns counted are the yields within a chunk, not those between chunks.
      largeSweepRequest({ frequencyCount: 150, inputCount: 1, chunkPointCount: 1000 }),
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
    // every 10 ms slice of computation, and 450 points (0.5 to 1.5 ms each) take many slices.
    // The bound is loose on purpose: the claim is that it yields, not how often.
    expect(turns).toBeGreaterThan(5);
    await runner.close();
  });

  /** Three chunks of one item; `chunkOne` runs the second (and may throw). */
  function threeChunks(
    calls: number[],
    chunkOne: (call: number) => Generator<number, void, void>,
  ): AnyChunkedComputation {
    return {
      kind: 'sweep',
      requestSchema: z.unknown(),
      plan: () => evenChunks(3, 1),
      *runChunk(_request, chunk) {
        calls.push(chunk.index);
        if (chunk.index === 1) yield* chunkOne(calls.length);
        yield 1;
        return chunk.index;
      },
      reduce: (_request, outputs) => outputs,
    };
  }

  it("a computation's own error fails the job at once, naming the chunk; later chunks never run", async () => {
    const calls: number[] = [];
    // eslint-disable-next-line require-yield
    const broken = threeChunks(calls, function* (call) {
      throw new Error(`chunk 1 broke (call ${call})`);
    });
    const runner = createInProcessRunner({
      computations: { ...JOB_COMPUTATIONS, sweep: broken },
      retryPolicies: { ...JOB_RETRY_POLICIES, sweep: { attempts: 3, backoffMs: 5 } },
    });
    const { id } = await runner.submit('sweep', {});
    const record = await waitForFinish(runner, id);
    expect(record).toMatchObject({
      state: 'failed',
      failureReason: 'chunk 1 (items 1-1) failed: chunk 1 broke (call 2)',
    });
    // The engine is deterministic: a retry would only throw again.
    expect(calls).toEqual([0, 1]);
    await runner.close();
  });

  it('each chunk starts on its own turn of the event loop, so chunks shorter than a slice still let get() see progress', async () => {
    const calls: number[] = [];
    const instant = threeChunks(calls, function* () {});
    const runner = createInProcessRunner({ computations: { ...JOB_COMPUTATIONS, sweep: instant } });
    const { id } = await runner.submit('sweep', {});
    // Poll on every turn of the loop (a timer could miss turns): a job that ran all its chunks
    // in one turn, as a queue never does, would show only 'queued' and then 'completed'.
    const seen: string[] = [];
    for (;;) {
      const record = await runner.get(id);
      if (record === undefined) throw new Error('the job vanished');
      seen.push(`${record.state} ${record.progress.done}/${record.progress.total}`);
      if (record.state === 'completed') break;
      await new Promise((resolve) => setImmediate(resolve));
    }
    expect(seen[0]).toBe('queued 0/0');
    expect(seen).toContain('running 1/3');
    expect(seen).toContain('running 2/3');
    expect(seen.at(-1)).toBe('completed 3/3');
    await runner.close();
  });

  it('a transient error is retried with backoff per the policy, then the job completes', async () => {
    const calls: number[] = [];
    // eslint-disable-next-line require-yield
    const flaky = threeChunks(calls, function* (call) {
      if (call <= 3) throw new TransientError(`lost the connection (call ${call})`);
    });
    const runner = createInProcessRunner({
      computations: { ...JOB_COMPUTATIONS, sweep: flaky },
      retryPolicies: { ...JOB_RETRY_POLICIES, sweep: { attempts: 3, backoffMs: 5 } },
    });
    const { id } = await runner.submit('sweep', {});
    const record = await waitForFinish(runner, id);
    expect(record.state).toBe('completed');
    expect((record.result as { output: unknown }).output).toEqual([0, 1, 2]);
    // Chunk 1 failed twice (calls 2 and 3) and succeeded on its third attempt.
    expect(calls).toEqual([0, 1, 1, 1, 2]);
    await runner.close();
  });

  it('a transient error on every attempt fails the job once the attempts are spent', async () => {
    const calls: number[] = [];
    // eslint-disable-next-line require-yield
    const down = threeChunks(calls, function* (call) {
      throw new TransientError(`lost the connection (call ${call})`);
    });
    const runner = createInProcessRunner({
      computations: { ...JOB_COMPUTATIONS, sweep: down },
      retryPolicies: { ...JOB_RETRY_POLICIES, sweep: { attempts: 2, backoffMs: 5 } },
    });
    const { id } = await runner.submit('sweep', {});
    const record = await waitForFinish(runner, id);
    expect(record).toMatchObject({
      state: 'failed',
      failureReason: 'chunk 1 (items 1-1) failed: lost the connection (call 3)',
    });
    expect(calls).toEqual([0, 1, 1]);
    await runner.close();
  });

  it('a chunk past chunkTimeoutMs fails the job, naming the limit, never retried', async () => {
    const calls: number[] = [];
    const endless = threeChunks(calls, function* () {
      for (;;) yield 0;
    });
    const runner = createInProcessRunner({
      computations: { ...JOB_COMPUTATIONS, sweep: endless },
      retryPolicies: { ...JOB_RETRY_POLICIES, sweep: { attempts: 3, backoffMs: 5 } },
      chunkTimeoutMs: 50,
    });
    const { id } = await runner.submit('sweep', {});
    const record = await waitForFinish(runner, id);
    expect(record.state).toBe('failed');
    expect(record.failureReason).toBe(
      'chunk 1 (items 1-1) failed: ran longer than the chunk time limit of 0.05 s (JOB_CHUNK_TIMEOUT_S)',
    );
    expect(calls).toEqual([0, 1]);
    await runner.close();
  });

  it('reduces the chunk outputs in chunk-index order into { meta, output }', async () => {
    const seen: unknown[][] = [];
    const ordered: AnyChunkedComputation = {
      kind: 'sweep',
      requestSchema: z.object({ total: z.int() }),
      plan: (request) => evenChunks((request as { total: number }).total, 3),
      *runChunk(_request, chunk) {
        for (let item = 1; item <= chunk.count; item += 1) yield item;
        return { first: chunk.start, count: chunk.count };
      },
      reduce: (_request, outputs) => {
        seen.push([...outputs]);
        return outputs.length;
      },
    };
    const runner = createInProcessRunner({ computations: { ...JOB_COMPUTATIONS, sweep: ordered } });
    const { id } = await runner.submit('sweep', { total: 8 });
    const record = await waitForFinish(runner, id);
    expect(seen).toEqual([
      [
        { first: 0, count: 3 },
        { first: 3, count: 3 },
        { first: 6, count: 2 },
      ],
    ]);
    expect(record.result).toMatchObject({ output: 3, meta: { inputHash: expect.any(String) } });
    expect(record.progress).toMatchObject({ done: 8, total: 8 });
    await runner.close();
  });

  it('close() cancels queued jobs and aborts the running one; submit then rejects', async () => {
    const runner = createInProcessRunner({ computations: JOB_COMPUTATIONS });
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
