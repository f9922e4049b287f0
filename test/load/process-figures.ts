import { existsSync, readFileSync } from 'node:fs';
import { Redis } from 'ioredis';

// What `npm run load` reads of the processes it measures, from /proc (Linux only) and Redis INFO.

/** CPU seconds (user + system) a process has used so far, from /proc/<pid>/stat. */
export function cpuSecondsOf(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  // Fields after the command (which may hold spaces) start after the last ')'.
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  const ticksPerS = 100; // USER_HZ, 100 on Linux
  return (Number(fields[11]) + Number(fields[12])) / ticksPerS;
}

/**
 * Minor page faults a process has taken so far, from /proc/<pid>/stat: each is a page of memory
 * touched for the first time since it was mapped (a fresh allocation the C library took from the
 * kernel), a kernel entry that costs CPU time of its own.
 */
export function minorFaultsOf(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[7]);
}

/** Resident set size of a process, MB, from /proc/<pid>/status. */
export function rssMbOf(pid: number): number {
  const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return match ? Number(match[1]) / 1024 : NaN;
}

/** The direct children of a process (the cluster's API processes), from /proc. */
export function childrenOf(pid: number): number[] {
  const text = readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8').trim();
  return text === '' ? [] : text.split(/\s+/).map(Number);
}

/** What the load script reads of Redis before and after a run. */
export interface RedisFigures {
  /** Used memory, MB (the stored designs and jobs live there). */
  usedMb: number;
  /** CPU time so far, s. */
  cpuS: number;
  /** Commands executed so far by name (INFO commandstats: `evalsha`, `hget`, …). */
  calls: Record<string, number>;
  /** Bytes received from clients so far (INFO stats total_net_input_bytes). */
  inputBytes: number;
  /** Minor page faults so far, when Redis runs on this machine (its process_id in /proc). */
  faults: number | undefined;
}

/** Redis's used memory, CPU time, commands executed and bytes received so far. */
export async function redisFigures(url: string): Promise<RedisFigures> {
  const client = new Redis(url, { maxRetriesPerRequest: 1 });
  try {
    const info = await client.info('all');
    const field = (name: string) => Number(new RegExp(`${name}:([\\d.]+)`).exec(info)?.[1]);
    const calls: Record<string, number> = {};
    for (const [, name, count] of info.matchAll(/^cmdstat_([^:]+):calls=(\d+)/gm)) {
      calls[name as string] = Number(count);
    }
    return {
      usedMb: field('used_memory') / 1024 ** 2,
      cpuS: field('used_cpu_sys') + field('used_cpu_user'),
      calls,
      inputBytes: field('total_net_input_bytes'),
      faults: existsSync(`/proc/${field('process_id')}/stat`)
        ? minorFaultsOf(field('process_id'))
        : undefined,
    };
  } finally {
    client.disconnect();
  }
}
