import { randomBytes } from 'node:crypto';
import { readdirSync, rmSync } from 'node:fs';
import { readdir, rm } from 'node:fs/promises';
import path from 'node:path';

/**
 * Temporary files beside their final names: ".<name>.<pid>.<random>.tmp".
 * Same directory, so the final rename stays on one file system and is atomic;
 * hidden and ending in .tmp, so a half-written file never looks like a result;
 * the process id lets a later run tell a live writer's file (shards write side
 * by side) from one left behind by a process that was killed.
 *
 * The names handed out by this thread are kept until `releaseTemp`, so that a
 * SIGINT or SIGTERM can remove them (`removeLiveTemps`, called by the command
 * line's signal handler). This registry is the one piece of module state in
 * io/: a signal handler has no other way to reach the files.
 */
const live = new Set<string>();
const roots = new Set<string>();

const TEMP_NAME = /^\.(.+)\.(\d+)\.[0-9a-f]+\.tmp$/;

/** A fresh temporary name beside `finalPath`, registered as live until released. */
export function tempPathFor(finalPath: string): string {
  const dir = path.dirname(finalPath);
  const base = path.basename(finalPath);
  const tmp = path.join(dir, `.${base}.${process.pid}.${randomBytes(6).toString('hex')}.tmp`);
  live.add(tmp);
  return tmp;
}

/** The temporary file was renamed or removed: forget it. */
export function releaseTemp(tmp: string): void {
  live.delete(tmp);
}

/**
 * A folder whose temporary files of this process are removed on a signal even
 * when another thread (a pyramid's tile workers) named them.
 */
export function addTempRoot(dir: string): void {
  roots.add(path.resolve(dir));
}

/** The final name and writer's process id of a temporary name, or null for any other name. */
export function parseTempName(name: string): { base: string; pid: number } | null {
  const m = TEMP_NAME.exec(name);
  return m === null ? null : { base: m[1]!, pid: Number(m[2]) };
}

/** Whether a process with this id is running (signal 0 checks without sending anything). */
export function processAlive(pid: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Removes the temporary files for `finalPath` (or, with no final name given,
 * for any file in `dir`) whose writing process is gone. Files of live
 * processes, this one included, are kept. Returns how many were removed.
 */
export async function removeStaleTemps(dir: string, finalName?: string): Promise<number> {
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return 0;
  }
  let removed = 0;
  for (const name of names) {
    const t = parseTempName(name);
    if (t === null || (finalName !== undefined && t.base !== finalName) || processAlive(t.pid)) continue;
    await rm(path.join(dir, name), { recursive: true, force: true });
    removed++;
  }
  return removed;
}

function removeOwnUnder(dir: string): void {
  let entries;
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return;
  }
  for (const e of entries) {
    const full = path.join(dir, e.name);
    if (parseTempName(e.name)?.pid === process.pid) rmSync(full, { recursive: true, force: true });
    else if (e.isDirectory()) removeOwnUnder(full);
  }
}

/**
 * Removes every temporary file this process still holds (synchronously: for
 * signal handlers). The names stay registered: a name handed out just before
 * the signal may have its file created a moment later by an open still in
 * flight, so the handler calls this again before it exits.
 */
export function removeLiveTemps(): void {
  for (const tmp of live) rmSync(tmp, { recursive: true, force: true });
  for (const dir of roots) removeOwnUnder(dir);
}

/** removeStaleTemps in `dir` and every folder below it (a pyramid's tile tree). */
export async function removeStaleTempsUnder(dir: string): Promise<number> {
  let removed = await removeStaleTemps(dir);
  let entries;
  try {
    entries = await readdir(dir, { withFileTypes: true });
  } catch {
    return removed;
  }
  for (const e of entries) if (e.isDirectory() && parseTempName(e.name) === null) removed += await removeStaleTempsUnder(path.join(dir, e.name));
  return removed;
}
