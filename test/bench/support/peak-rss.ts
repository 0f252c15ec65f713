import { readFileSync } from 'node:fs';

/** This process's peak resident set size so far, in MB (the kernel's high-water mark, so nothing is missed between samples). */
export function peakRssMb(): number {
  // maxRSS is reported in kilobytes.
  return Math.round(process.resourceUsage().maxRSS / 1024);
}

/**
 * Another process's peak resident set size in MB, from its `VmHWM` in /proc (Linux), or null
 * when it cannot be read (process gone, another system).
 */
export function processPeakRssMb(pid: number): number | null {
  let status: string;
  try {
    status = readFileSync(`/proc/${pid}/status`, 'utf8');
  } catch {
    // Not Linux, or the process has exited: the figure is simply not available.
    return null;
  }
  const match = /^VmHWM:\s+(\d+)\s+kB$/m.exec(status);
  return match ? Math.round(Number(match[1]) / 1024) : null;
}
