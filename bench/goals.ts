/**
 * How the benchmarks print a figure: the value, its goal, whether it is met, and the machine's
 * load average at the moment it was measured (other work on the machine inflates wall times, so a
 * figure without the load beside it cannot be compared with another).
 */
import { cpus, loadavg } from 'node:os';

/** The 1-, 5- and 15-minute load averages and the core count, e.g. `load 1.93 2.41 3.10 / 2 cores`. */
export function loadText(): string {
  const [a = 0, b = 0, c = 0] = loadavg();
  const n = cpus().length;
  return `load ${a.toFixed(2)} ${b.toFixed(2)} ${c.toFixed(2)} / ${n} cores${a > n ? ' (busy)' : ''}`;
}

/** `met` or `NOT met` for a figure that should be at most `goal` (null: not measured). */
export function verdict(value: number | null, goal: number): string {
  if (value === null || !Number.isFinite(value)) return 'not measured';
  return value <= goal ? 'met' : 'NOT met';
}

/**
 * One line: label, value with unit, the goal, the verdict and the load average now.
 * @param decimals  decimals of the value and the goal (default 2; MB and s figures pass 1 or 2).
 */
export function goalRow(label: string, value: number | null, unit: string, goal: number, decimals = 2): string {
  const shown = value === null || !Number.isFinite(value) ? 'n/a' : value.toFixed(decimals);
  const goalText = `goal ≤ ${goal} ${unit}`.padEnd(14);
  const verdictText = verdict(value, goal).padEnd(8);
  return `${label.padEnd(50)} ${shown.padStart(9)} ${unit.padEnd(3)} ${goalText} ${verdictText} [${loadText()}]`;
}

/** One line for a figure without a goal of its own (a breakdown or a context figure). */
export function infoRow(label: string, value: number | null, unit: string, decimals = 2): string {
  const shown = value === null || !Number.isFinite(value) ? 'n/a' : value.toFixed(decimals);
  return `${label.padEnd(50)} ${shown.padStart(9)} ${unit.padEnd(3)} ${''.padEnd(23)} [${loadText()}]`;
}

/** Median of a list (the mean of the two middle values for an even count). */
export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** The value at fraction `p` (0…1) of the sorted list. */
export function percentile(xs: readonly number[], p: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * s.length))]!;
}

/** Times `f` after `warmup` calls: wall-clock and CPU milliseconds per call, each sorted ascending. */
export function timeRuns(f: () => unknown, runs: number, warmup: number): { wall: number[]; cpu: number[] } {
  for (let i = 0; i < warmup; i++) f();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    f();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  wall.sort((a, b) => a - b);
  cpu.sort((a, b) => a - b);
  return { wall, cpu };
}
