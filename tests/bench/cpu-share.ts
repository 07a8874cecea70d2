/** CPU shares for the Chromium benchmarks: the machine's, and this bench's own processes split into Chromium, the app server and this driver. */
import { readdirSync, readFileSync } from 'node:fs';
import { round } from './remote-teammates';

/** CPU seconds so far, from /proc (Linux, clock ticks of 1/100 s): the machine, and this bench's own processes. */
export interface CpuSample {
  atMs: number;
  machineBusyS: number;
  /** The bench's process tree, split: Chromium (all its processes), the app server (with its worker threads), the rest (this driver). */
  browserS: number;
  serverS: number;
  driverS: number;
}

export function cpuSample(serverPid: number): CpuSample {
  const fields = readFileSync('/proc/stat', 'utf8').split('\n')[0].trim().split(/\s+/).slice(1).map(Number);
  const machineBusyS = (fields.reduce((sum, value) => sum + value, 0) - fields[3] - (fields[4] ?? 0)) / 100;
  const processes = new Map<number, { parent: number; name: string; cpuS: number }>();
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      const name = stat.slice(stat.indexOf('(') + 1, stat.lastIndexOf(')'));
      const rest = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      processes.set(Number(entry), { parent: Number(rest[1]), name, cpuS: (Number(rest[11]) + Number(rest[12])) / 100 });
    } catch {
      // The process ended between the listing and the read.
    }
  }
  const sample = { atMs: performance.now(), machineBusyS, browserS: 0, serverS: 0, driverS: 0 };
  for (const [pid, info] of processes) {
    // Walk up to this driver; note on the way whether the app server is an ancestor (or the process itself).
    let underServer = false;
    let current: number | undefined = pid;
    while (current !== undefined && current > 1 && current !== process.pid) {
      if (current === serverPid) underServer = true;
      current = processes.get(current)?.parent;
    }
    if (current !== process.pid) continue;
    if (underServer) sample.serverS += info.cpuS;
    else if (info.name.startsWith('chrom')) sample.browserS += info.cpuS;
    else sample.driverS += info.cpuS;
  }
  return sample;
}

/** CPU use between two samples, in percent of one core. */
export function cpuBetween(before: CpuSample, after: CpuSample) {
  const seconds = (after.atMs - before.atMs) / 1000;
  const percent = (value: number) => round((value / seconds) * 100);
  const ours = after.browserS - before.browserS + (after.serverS - before.serverS) + (after.driverS - before.driverS);
  return {
    wholeMachine: percent(after.machineBusyS - before.machineBusyS),
    chromium: percent(after.browserS - before.browserS),
    appServer: percent(after.serverS - before.serverS),
    benchDriver: percent(after.driverS - before.driverS),
    otherProcesses: percent(Math.max(0, after.machineBusyS - before.machineBusyS - ours)),
  };
}

