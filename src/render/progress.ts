/**
 * Progress with an ETA on stderr: a line rewritten in place when stderr is a
 * terminal (design.md: progress goes to stderr, only on a terminal; stdout
 * carries --json alone), or with `json` one JSON object per line, terminal or
 * not, for a scheduler or a script to read:
 * {"done":D,"total":T,"eta_s":S,"phase":"...","elapsed_s":E} (eta_s null until
 * something is done). JSON lines come at most once a second, plus the line
 * where done reaches total. The one reporter of every long command: plates,
 * pyramids, the census and its listing, section constants.
 */
export interface Progress {
  /** `phase` overrides the phase of the JSON line (a command whose work has stages). */
  update(done: number, total: number, phase?: string): void;
  end(): void;
}

export interface ProgressOptions {
  readonly stream?: NodeJS.WritableStream & { isTTY?: boolean };
  /** One JSON object per line instead of the terminal line. */
  readonly json?: boolean;
  /** What is counted, in the terminal line (default "tiles"). */
  readonly unit?: string;
  /** The phase named in JSON lines (default: the label). */
  readonly phase?: string;
  /** Show nothing on the terminal before this many milliseconds (default 0); JSON lines are not delayed. */
  readonly delayMs?: number;
}

export function createProgress(label: string, options: ProgressOptions = {}): Progress {
  const stream = options.stream ?? process.stderr;
  const json = options.json === true;
  if (!json && stream.isTTY !== true) return { update: () => undefined, end: () => undefined };
  const unit = options.unit ?? 'tiles';
  const phase = options.phase ?? label;
  const delay = json ? 0 : (options.delayMs ?? 0);
  const start = Date.now();
  let last = -Infinity;
  let shown = false;
  let finished = false;
  return {
    update(done, total, stage) {
      const now = Date.now();
      if (now - start < delay) return;
      if (json) {
        if (finished || (done < total && now - last < 1000)) return;
      } else if (done < total && now - last < 200) return;
      last = now;
      const elapsed = (now - start) / 1000;
      const eta = done > 0 ? (elapsed * (total - done)) / done : NaN;
      if (json) {
        finished = done >= total;
        const etaS = Number.isFinite(eta) ? Math.round(eta * 10) / 10 : null;
        stream.write(`${JSON.stringify({ done, total, eta_s: etaS, phase: stage ?? phase, elapsed_s: Math.round(elapsed * 10) / 10 })}\n`);
        return;
      }
      const pct = total > 0 ? Math.floor((100 * done) / total) : 100;
      const etaText = Number.isFinite(eta) ? `eta ${formatSeconds(eta)}` : 'eta --';
      stream.write(`\r${label} ${String(pct).padStart(3)}% ${done}/${total} ${unit}, ${formatSeconds(elapsed)} elapsed, ${etaText}\u001b[K`);
      shown = true;
    },
    end() {
      if (shown) stream.write('\r\u001b[K');
    },
  };
}

export function formatSeconds(s: number): string {
  if (s < 60) return `${s.toFixed(1)}s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m}m${String(Math.round(s - 60 * m)).padStart(2, '0')}s`;
  return `${Math.floor(m / 60)}h${String(m % 60).padStart(2, '0')}m`;
}
