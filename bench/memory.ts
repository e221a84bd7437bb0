/** The resident-set peak of this process, as the bench's child processes measure it. */
import { readFileSync, writeFileSync } from 'node:fs';

/** Peak resident set since the last reset (Linux VmHWM), or the process's maxRSS when /proc is missing. */
export function peakBytes(): number {
  try {
    return Number(/VmHWM:\s+(\d+)/.exec(readFileSync('/proc/self/status', 'utf8'))![1]) * 1024;
  } catch {
    return process.resourceUsage().maxRSS * 1024;
  }
}

/** Resets the peak to the current resident set; false where the system cannot (then peaks count from the start). */
export function resetPeak(): boolean {
  try {
    writeFileSync('/proc/self/clear_refs', '5'); // Linux ≥ 4.0: resets VmHWM to the current RSS
    return true;
  } catch {
    return false;
  }
}
