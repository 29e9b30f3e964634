// Every test file removes the temporary folders it made (test/helpers/run-cli.ts tempDir).
import { afterAll } from 'vitest';
import { removeTempDirs } from './helpers/run-cli.js';

afterAll(() => removeTempDirs());
