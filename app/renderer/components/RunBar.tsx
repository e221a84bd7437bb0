/** Run and cancel, with a progress bar of one segment per frequency and the elapsed and remaining time. */
import type { CheckState, FrequencyState, Progress, RunStatus } from '../model/run.ts';
import { formatClock, formatHz } from '../model/units.ts';

export interface RunBarProps {
  status: RunStatus;
  /** Why the run button is disabled; null when it can run. */
  blocker: string | null;
  frequencies: readonly FrequencyState[];
  /** The order checks at p + 1 after the sweep. */
  checks?: readonly CheckState[];
  progress: Progress;
  workers: number;
  onRun(): void;
  onCancel(): void;
}

const STATUS_WORDS: Record<FrequencyState['status'], string> = { queued: 'waiting', solving: 'solving', done: 'solved', failed: 'failed', unsolved: 'not solved' };

export function RunBar(p: RunBarProps) {
  const active = p.status === 'preparing' || p.status === 'running';
  const { progress: g } = p;
  return (
    <section className="run-bar" aria-label="Run">
      {active
        ? <button type="button" className="cancel" onClick={p.onCancel}>Cancel</button>
        : <button type="button" className="run" onClick={p.onRun} disabled={p.blocker !== null} aria-describedby={p.blocker ? 'qg-run-blocker' : undefined}>▶ Run sweep</button>}
      {!active && p.blocker && <p id="qg-run-blocker" className="blocker" role="status">{p.blocker}</p>}
      {(active || p.status !== 'idle') && p.frequencies.length > 0 && (
        <div className="progress" role="progressbar" aria-valuemin={0} aria-valuemax={g.total} aria-valuenow={g.done + g.failed}
          aria-label={`${g.done + g.failed} of ${g.total} frequencies finished`}>
          <ol className="segments">
            {p.frequencies.map((s) => (
              <li key={s.frequencyHz} className={s.status} title={`${formatHz(s.frequencyHz)}: ${STATUS_WORDS[s.status]}${s.seconds !== undefined ? ` in ${s.seconds.toFixed(1)} s` : ''}${s.message ? ` – ${s.message}` : ''}`} />
            ))}
            {(p.checks ?? []).map((c) => (
              <li key={`check-${c.frequencyHz}`} className={`check ${c.status === 'queued' ? 'queued' : c.status === 'dropped' ? 'unsolved' : c.status}`}
                title={`order check at ${formatHz(c.frequencyHz)}: ${c.status}${c.message ? ` – ${c.message}` : ''}`} />
            ))}
          </ol>
          <p className="progress-text" data-testid="run-status">
            {p.status === 'preparing' && 'Preparing the mesh… '}
            {g.done} of {g.total} solved{g.failed > 0 && `, ${g.failed} failed`}
            {active && g.done + g.failed === g.total && (p.checks ?? []).some((c) => c.status === 'queued' || c.status === 'solving') && ' · checking the order'}
            {' · '}{formatClock(g.elapsedSeconds)} elapsed
            {active && <> · {g.remainingSeconds === null ? 'estimating time left' : `about ${formatClock(g.remainingSeconds)} left`} · {p.workers} worker{p.workers === 1 ? '' : 's'}</>}
            {p.status === 'cancelled' && ' · cancelled'}
            {p.status === 'done' && ' · done'}
          </p>
        </div>
      )}
    </section>
  );
}
