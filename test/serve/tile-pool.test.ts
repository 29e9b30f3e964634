/**
 * The survey's tile pool: a tile that nobody waits for any more is withdrawn
 * before a worker takes it, the queue sheds past its bound, and one pool
 * serves tiles of several jobs with the same bytes as a pool per job.
 */
import { describe, expect, it } from 'vitest';
import { QueueFull, TilePool, Withdrawn } from '../../src/serve/tile-pool.js';
import { frameSheet, surveyBase, TileService } from '../../src/serve/tile-service.js';
import { parseSheet } from '../../src/view/sheet.js';

const base = surveyBase(parseSheet({ iterations: 400, samples: 4 }));

describe('TilePool', () => {
  it('withdraws waiting tiles whose asker has gone, and sheds past its queue bound', async () => {
    const service = new TileService(base, { workers: 1, maxQueue: 1, cacheBytes: 0 });
    const { key, job } = service.job({ re: '-0.75', im: '0', span: '3', width: 512, height: 512 }, 0);
    await service.close();
    const pool = new TilePool(1, 3);
    try {
      const tile = (k: number) => ({ index: k, x0: (k % 8) * 64, y0: 0, w: 64, h: 64 });
      const first = pool.render(key, job, { index: 0, x0: 0, y0: 0, w: 256, h: 256 });
      const gone = new AbortController();
      const waiting = [pool.render(key, job, tile(1), gone.signal), pool.render(key, job, tile(2), gone.signal), pool.render(key, job, tile(3))];
      expect(pool.queued).toBe(3);
      await expect(pool.render(key, job, tile(4))).rejects.toBeInstanceOf(QueueFull);
      gone.abort();
      await expect(waiting[0]).rejects.toBeInstanceOf(Withdrawn);
      await expect(waiting[1]).rejects.toBeInstanceOf(Withdrawn);
      expect(pool.queued).toBeLessThanOrEqual(1);
      const done = await waiting[2];
      expect(done.tile).toEqual(tile(3));
      expect((await first).pixels.length).toBe(256 * 256 * 3);
    } finally {
      await pool.close();
    }
  }, 60_000);

  it('renders tiles of two jobs interleaved on one pool as each job alone does', async () => {
    const frames = [
      { re: '-0.75', im: '0', span: '3', width: 128, height: 128 },
      { re: '-0.1', im: '0.9', span: '0.5', width: 128, height: 128 },
    ];
    const shared = new TileService(base, { workers: 2, maxQueue: 64, cacheBytes: 0 });
    const alone = frames.map(() => new TileService(base, { workers: 1, maxQueue: 64, cacheBytes: 0 }));
    try {
      const asks = [];
      for (let k = 0; k < 8; k++) asks.push({ frame: frames[k % 2]!, level: 0, size: 32, tx: (k % 4) - 2, ty: Math.floor(k / 4) - 1 });
      const together = await Promise.all(asks.map((a) => shared.tile(a)));
      for (let k = 0; k < asks.length; k++) {
        const single = await alone[k % 2]!.tile(asks[k]!);
        expect(together[k]!.png.equals(single.png), `tile ${k}`).toBe(true);
      }
      // The two frames differ, so a mix-up of jobs would show.
      expect(together[0]!.png.equals(together[1]!.png)).toBe(false);
      expect(frameSheet(base, frames[1]!, 0).view.span).toBe('0.5');
    } finally {
      await Promise.all([shared.close(), ...alone.map((s) => s.close())]);
    }
  }, 60_000);
});
