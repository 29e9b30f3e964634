import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { Received, UserError } from '../check/user-error.js';

/** Reads a sheet file as raw JSON (validation is parseSheet's job). */
export async function readSheetFile(file: string): Promise<Record<string, unknown>> {
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (err) {
    throw new UserError('sheet', 'a readable sheet file', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? 'unreadable'})`));
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (err) {
    throw new UserError('sheet', 'valid JSON', new Received(`${file}: ${(err as Error).message}`));
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw new UserError('sheet', 'a JSON object', value);
  return value as Record<string, unknown>;
}

/** A sheet's name: its file name without the extension. */
export function sheetName(file: string): string {
  return path.basename(file).replace(/\.json$/i, '');
}
