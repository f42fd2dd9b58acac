import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CliError, parseArgs, runLoads } from '../../../server/cli/loads';

// The CLI's figures and units are checked in tests/reference/demo-structure.test.ts.
describe('loads CLI', () => {
  it('reads a survey file of format version 1 (upgraded first) with the same results', () => {
    const dir = mkdtempSync(join(tmpdir(), 'brineline-cli-'));
    try {
      const old = { ...JSON.parse(readFileSync('seeds/demo-survey.json', 'utf8')), schemaVersion: 1 };
      const file = join(dir, 'v1.json');
      writeFileSync(file, JSON.stringify(old));
      const r = runLoads(parseArgs([file]));
      expect(r.boundaries).toEqual(runLoads(parseArgs(['seeds/demo-survey.json'])).boundaries);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
  it('missing file and bad options give clear errors', () => {
    expect(() => runLoads(parseArgs(['no-such-file.json']))).toThrow(/no-such-file.json: file not found/);
    expect(() => parseArgs(['x.json', '--units', 'furlongs'])).toThrow(CliError);
    expect(() => parseArgs([])).toThrow(/usage/);
  });
});
