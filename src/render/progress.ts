/**
 * Progress with an ETA on stderr, only when stderr is a terminal (design.md:
 * progress goes to stderr, only on a terminal; stdout carries --json alone).
 */
export interface Progress {
  update(done: number, total: number): void;
  end(): void;
}

export function createProgress(label: string, stream: NodeJS.WriteStream = process.stderr): Progress {
  if (!stream.isTTY) return { update: () => undefined, end: () => undefined };
  const start = Date.now();
  let last = 0;
  let shown = false;
  return {
    update(done, total) {
      const now = Date.now();
      if (done < total && now - last < 200) return;
      last = now;
      const elapsed = (now - start) / 1000;
      const eta = done > 0 ? (elapsed * (total - done)) / done : NaN;
      const pct = total > 0 ? Math.floor((100 * done) / total) : 100;
      const etaText = Number.isFinite(eta) ? `eta ${formatSeconds(eta)}` : 'eta --';
      stream.write(`\r${label} ${String(pct).padStart(3)}% ${done}/${total} tiles, ${formatSeconds(elapsed)} elapsed, ${etaText}\u001b[K`);
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
