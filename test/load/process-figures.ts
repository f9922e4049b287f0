import { readFileSync } from 'node:fs';
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

/** Redis's used memory (MB: the stored designs and jobs live there) and CPU time (s) so far. */
export async function redisFigures(url: string): Promise<{ usedMb: number; cpuS: number }> {
  const client = new Redis(url, { maxRetriesPerRequest: 1 });
  try {
    const info = await client.info();
    const field = (name: string) => Number(new RegExp(`${name}:([\\d.]+)`).exec(info)?.[1]);
    return {
      usedMb: field('used_memory') / 1024 ** 2,
      cpuS: field('used_cpu_sys') + field('used_cpu_user'),
    };
  } finally {
    client.disconnect();
  }
}
