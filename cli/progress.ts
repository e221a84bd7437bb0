/**
 * Progress of a sweep on stderr: a bar redrawn in place on a terminal, one line per frequency
 * otherwise (a log file or a CI job cannot take carriage returns).
 */
import type { PointResult } from '../engine/solve/points.ts';
import { hz } from './common.ts';

export interface ProgressStream {
  write(text: string): unknown;
  isTTY?: boolean;
  columns?: number;
}

const BAR_WIDTH = 24;

export class Progress {
  private done = 0;
  private drawn = false;
  constructor(private readonly total: number, private readonly stream: ProgressStream, private readonly now: () => number, private readonly start = now()) {}

  solved(point: PointResult): void {
    this.done++;
    this.report(`${hz(point.frequencyHz)} Hz: ${pointSummary(point)}`);
  }

  failed(frequencyHz: number, message: string): void {
    this.done++;
    this.report(`${hz(frequencyHz)} Hz FAILED: ${message}`);
  }

  /** An order-check solve at p + 1 finished (it counts in the total like a frequency). */
  checked(point: PointResult, order: number): void {
    this.done++;
    this.report(`${hz(point.frequencyHz)} Hz order check at p = ${order}: ${pointSummary(point)}`);
  }

  checkFailed(frequencyHz: number, message: string): void {
    this.done++;
    this.report(`${hz(frequencyHz)} Hz order check failed: ${message}`);
  }

  /** Ends the bar's line so that what follows starts on a line of its own. */
  finish(): void {
    if (this.drawn) this.stream.write('\n');
    this.drawn = false;
  }

  private report(what: string): void {
    const elapsed = (this.now() - this.start) / 1000;
    const left = this.done > 0 ? (elapsed / this.done) * (this.total - this.done) : NaN;
    const times = `elapsed ${clock(elapsed)}, left ~${clock(left)}`;
    if (!this.stream.isTTY) {
      this.stream.write(`[${this.done}/${this.total}] ${what} (${times})\n`);
      return;
    }
    const filled = Math.round((BAR_WIDTH * this.done) / this.total);
    const line = `[${'#'.repeat(filled)}${'-'.repeat(BAR_WIDTH - filled)}] ${this.done}/${this.total} solves, ${times}  ${what}`;
    // \r back to the line's start, ESC[K to clear what a longer previous line left.
    this.stream.write(`\r${line.slice(0, Math.max(40, (this.stream.columns || 100) - 1))}\x1b[K`);
    this.drawn = true;
  }
}

function pointSummary(p: PointResult): string {
  if (p.kind === 'duct') return p.tlDb === null ? 'no TL (closed outlet)' : `TL ${p.tlDb.toFixed(2)} dB`;
  return p.receivers.map((r) => `${r.name} ${r.splDb.toFixed(1)} dB`).join(', ') || 'solved';
}

/** m:ss, or h:mm:ss past an hour. */
export function clock(seconds: number): string {
  if (!Number.isFinite(seconds)) return '?';
  const s = Math.round(seconds), h = Math.floor(s / 3600), m = Math.floor((s % 3600) / 60), r = s % 60;
  const mm = h > 0 ? String(m).padStart(2, '0') : String(m);
  return `${h > 0 ? `${h}:` : ''}${mm}:${String(r).padStart(2, '0')}`;
}
