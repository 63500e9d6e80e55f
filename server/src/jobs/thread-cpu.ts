import { closeSync, openSync, readSync } from 'node:fs';

/**
 * CPU time the calling thread has used so far, in ms: what a job worker reports as the engine's own
 * time (read around its calls), so the benchmark can tell the job's code from the machine's drift. On
 * Linux it is the scheduler's account of this one thread (/proc/thread-self/schedstat, nanoseconds,
 * through a file each thread keeps open: about 3 µs a read); elsewhere the whole process's
 * (process.cpuUsage), which is nearly the same while one thread computes.
 */
export function threadCpuMs(): number {
  if (schedstat === undefined) schedstat = openSchedstat();
  if (schedstat !== null) return runningNs(schedstat) / 1e6;
  const used = process.cpuUsage();
  return (used.user + used.system) / 1000;
}

/** The calling thread's schedstat file (opened by it, since /proc/thread-self is whoever opens it), or null where there is none. */
let schedstat: number | null | undefined;
const buffer = Buffer.alloc(96);

/** The file's first field: time spent running, in nanoseconds. */
function runningNs(fd: number): number {
  const n = readSync(fd, buffer, 0, buffer.length, 0);
  return Number(buffer.toString('latin1', 0, n).split(' ', 1)[0]);
}

function openSchedstat(): number | null {
  let fd: number;
  try {
    fd = openSync('/proc/thread-self/schedstat', 'r');
  } catch {
    return null;
  }
  if (Number.isFinite(runningNs(fd))) return fd;
  closeSync(fd);
  return null;
}
