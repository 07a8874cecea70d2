/**
 * The server under measurement in its own process (as `npm start` runs it, on a fresh database with
 * the demo studio), and what the benchmarks read about it from /proc.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/**
 * Starts server/main.ts under tsx in a child process on a free port. `nodeArgs` go before the
 * script (e.g. `--cpu-prof --cpu-prof-dir=…` to profile the server).
 */
export function startBenchServer(nodeArgs: string[] = []): Promise<{ child: ChildProcess; port: number }> {
  const dir = mkdtempSync(join(tmpdir(), 'tautline-collab-bench-'));
  const env = { ...process.env, DATABASE_PATH: join(dir, 'bench.sqlite'), JWT_SECRET: randomBytes(32).toString('hex'), PORT: '0', SMTP_URL: 'smtp://127.0.0.1:9' };
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', 'server/main.ts'], { cwd: ROOT, env });
    // Never left running when the benchmark's process ends, however it ends.
    process.once('exit', () => child.kill('SIGKILL'));
    let output = '';
    child.stdout?.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const match = /listening on http:\/\/localhost:(\d+)/.exec(output);
      if (match) resolve({ child, port: Number(match[1]) });
    });
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('exit', (code) => reject(new Error(`server exited ${code}: ${output}`)));
  });
}

/** Stops the server and waits for it to exit (SIGINT lets `--cpu-prof` write its profile). */
export function stopBenchServer(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (child.exitCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    child.removeAllListeners('exit');
    child.once('exit', () => resolve());
    child.kill(signal);
  });
}

/** User + system CPU seconds in a /proc stat file (a process's, or one thread's). */
function statCpuS(path: string): number {
  const stat = readFileSync(path, 'utf8').split(') ')[1].split(' ');
  return (Number(stat[11]) + Number(stat[12])) / 100;
}

/**
 * CPU seconds of a process (all threads) and of its main thread alone (the event loop: what one
 * server can do at most is one core of it), and its resident memory, from /proc (Linux).
 */
export function processStats(pid: number): { cpuS: number; mainThreadCpuS: number; rssMB: number } {
  const rssPages = Number(readFileSync(`/proc/${pid}/statm`, 'utf8').split(' ')[1]);
  return { cpuS: statCpuS(`/proc/${pid}/stat`), mainThreadCpuS: statCpuS(`/proc/${pid}/task/${pid}/stat`), rssMB: (rssPages * 4096) / 2 ** 20 };
}

/** Busy CPU seconds of the whole machine, all cores together (from /proc/stat; Linux): to see what other processes took. */
export function machineBusyS(): number {
  const fields = readFileSync('/proc/stat', 'utf8').split('\n')[0].trim().split(/\s+/).slice(1).map(Number);
  const [user, nice, system, idle, iowait, irq, softirq, steal] = fields;
  void idle;
  void iowait;
  return (user + nice + system + irq + softirq + steal) / 100;
}

/** The p-th percentile (nearest rank) of `values`; NaN when there are none. */
export function percentile(values: readonly number[], p: number): number {
  if (values.length === 0) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

export const round = (value: number) => Math.round(value * 100) / 100;

/** p50, p95 and p99 of a list of milliseconds, rounded, with the sample count. */
export function latencySummary(values: readonly number[]): { samples: number; p50: number; p95: number; p99: number } {
  return { samples: values.length, p50: round(percentile(values, 50)), p95: round(percentile(values, 95)), p99: round(percentile(values, 99)) };
}
