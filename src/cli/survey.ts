/**
 * `quadatlas survey [SHEET]`: a local page to explore the c-plane live
 * (tiles rendered on demand by the plate renderer), probe any point and take
 * the view home as a sheet or a print. The first line on stdout is the
 * page's address with this run's token; the server runs until SIGINT or
 * SIGTERM, then stops cleanly (exit 0).
 */
import { spawn } from 'node:child_process';
import os from 'node:os';
import type { Command } from 'commander';
import { optionalInteger, parseInteger } from '../check/fields.js';
import { Received, UserError } from '../check/user-error.js';
import { removeLiveTemps } from '../io/temp-path.js';
import { startSurvey } from '../serve/survey-server.js';
import { surveyBase } from '../serve/tile-service.js';
import { parseSheet } from '../view/sheet.js';
import { addOptions, type OptionSpec } from './option-spec.js';
import { readSheetFile, sheetName } from './sheet-file.js';

export const SURVEY_OPTIONS: readonly OptionSpec[] = [
  { flags: '--port <n>', description: 'TCP port to listen on (0: any free port)', default: '0' },
  { flags: '--host <address>', description: 'address to listen on; anything but loopback also needs --allow-remote', default: '127.0.0.1' },
  { flags: '--allow-remote', description: 'allow a --host that is not loopback: anyone who reaches it and holds the printed address can use the page (default: off)' },
  { flags: '--open', description: 'open the page in the default browser (default: off)' },
  { flags: '--out-dir <dir>', description: "folder the page's Print button writes into (the server names the files)", default: 'out' },
  { flags: '--workers <n>', description: 'tile workers (default: one per core)' },
  { flags: '--cache <mib>', description: 'memory for rendered tiles, in MiB', default: '64' },
];

const LOOPBACK = /^(127\.\d+\.\d+\.\d+|::1|localhost)$/i;

/** Opens the address in the system's browser, without waiting for it. */
function openBrowser(url: string): void {
  const [cmd, args] = process.platform === 'darwin' ? ['open', [url]] : process.platform === 'win32' ? ['cmd', ['/c', 'start', '', url]] : ['xdg-open', [url]];
  try {
    const child = spawn(cmd, args, { stdio: 'ignore', detached: true });
    child.on('error', () => process.stderr.write(`quadatlas: note: could not start ${cmd}; open the address above by hand\n`));
    child.unref();
  } catch {
    process.stderr.write(`quadatlas: note: could not start ${cmd}; open the address above by hand\n`);
  }
}

export function register(program: Command): void {
  const cmd = program
    .command('survey')
    .description('explore the c-plane live in a browser, probe points, save the view as a sheet')
    .argument('[sheet]', 'a sheet whose colouring, iterations and samples the page uses (its view is where the page opens)');
  addOptions(cmd, SURVEY_OPTIONS);
  cmd.action(async (sheetFile: string | undefined, values: Record<string, unknown>) => {
    const port = parseInteger(values['port'], '--port', 0, 65535);
    const host = String(values['host']);
    if (!/^[0-9A-Za-z.:-]{1,64}$/.test(host)) throw new UserError('--host', 'an IP address or host name', host);
    if (/^(0\.0\.0\.0|::|\[::\])$/.test(host)) throw new UserError('--host', 'one address of this machine (the Host check needs the name browsers will use), not a wildcard', host);
    const remote = !LOOPBACK.test(host);
    if (remote && values['allowRemote'] !== true) throw new UserError('--host', 'a loopback address (127.0.0.1, ::1), or --allow-remote as well', host);
    const workers = optionalInteger(values['workers'], '--workers', 1, 256) ?? Math.max(1, os.availableParallelism());
    const cacheMiB = parseInteger(values['cache'], '--cache', 1, 16384);
    const raw = sheetFile === undefined ? { iterations: 'auto', samples: 4 } : await readSheetFile(sheetFile);
    delete raw['startup'];
    const base = surveyBase(parseSheet(raw, sheetFile === undefined ? 'survey' : sheetName(sheetFile)));
    if (remote)
      process.stderr.write(
        `quadatlas: warning: listening on ${host}, not loopback: anyone who can reach it and has the address printed below can use the page and print into ${String(values['outDir'])}\n`,
      );
    let server;
    try {
      server = await startSurvey({ host, port, base, outDir: String(values['outDir']), workers, cacheBytes: cacheMiB * 1024 * 1024 });
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code;
      if (code === 'EADDRINUSE' || code === 'EACCES' || code === 'EADDRNOTAVAIL')
        throw new UserError('--port', `a port free to listen on at ${host}`, new Received(`${port} (${code})`));
      throw err;
    }
    process.stdout.write(`${server.url}\n`);
    process.stderr.write(`quadatlas survey: serving the page at ${server.origin} with ${workers} tile worker${workers === 1 ? '' : 's'}; Ctrl-C stops\n`);
    if (values['open'] === true) openBrowser(server.url);
    const running = server;
    await new Promise<void>((resolve) => {
      let stopping = false;
      const stop = (signal: string): void => {
        if (stopping) return;
        stopping = true;
        process.stderr.write(`\nquadatlas survey: stopped by ${signal}\n`);
        const done = (): void => {
          removeLiveTemps();
          // A print in hand still holds its render workers: they must not keep the process alive.
          setTimeout(() => {
            removeLiveTemps();
            process.exit(0);
          }, 300).unref();
          resolve();
        };
        running.close().then(done, done);
      };
      process.once('SIGINT', () => stop('SIGINT'));
      process.once('SIGTERM', () => stop('SIGTERM'));
    });
  });
}
