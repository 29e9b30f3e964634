/**
 * `quadatlas section ...`: the real slice. Each subcommand lives in its own
 * file under ./section/ and registers itself here; the mathematics lives in
 * src/section/.
 */
import type { Command } from 'commander';
import { register as registerCascade } from './section/cascade.js';
import { register as registerCompare } from './section/compare.js';
import { register as registerConstants } from './section/constants.js';
import { register as registerConvert } from './section/convert.js';
import { register as registerEntropy } from './section/entropy.js';
import { register as registerDiagram } from './section/diagram.js';
import { register as registerLyapunov } from './section/lyapunov.js';
import { register as registerWindows } from './section/windows.js';
import { register as registerUniversality } from './section/universality.js';
import { registerOrbitCommands } from './section/orbit.js';

export function register(program: Command): void {
  const section = program.command('section').description('the real slice: convert, cascade, windows, lyapunov, diagram, compare, orbit, cobweb, constants, universality, entropy');
  // commander's own errors (unknown flag, missing value) in the one message style: one line, prefixed.
  section.configureOutput({
    outputError: (text, write) =>
      write(
        `${text.startsWith('quadatlas:') ? '' : 'quadatlas: '}${text
          .replace(/^error: /, '')
          .trim()
          .replace(/\s*\n\s*/g, ' ')}\n`,
      ),
  });
  registerConvert(section);
  registerCascade(section);
  registerWindows(section);
  registerLyapunov(section);
  registerEntropy(section);
  registerDiagram(section);
  registerCompare(section);
  registerOrbitCommands(section);
  registerConstants(section);
  registerUniversality(section);
}
