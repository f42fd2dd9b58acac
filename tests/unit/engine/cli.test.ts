import { describe, expect, it } from 'vitest';
import { CliError, parseArgs, runLoads } from '../../../server/cli/loads';

// The CLI's figures and units are checked in tests/reference/demo-structure.test.ts.
describe('loads CLI', () => {
  it('missing file and bad options give clear errors', () => {
    expect(() => runLoads(parseArgs(['no-such-file.json']))).toThrow(/no-such-file.json: file not found/);
    expect(() => parseArgs(['x.json', '--units', 'furlongs'])).toThrow(CliError);
    expect(() => parseArgs([])).toThrow(/usage/);
  });
});
