import { describe, expect, it } from 'vitest';
import { CliError, parseArgs, renderTable, runLoads } from '../../../server/cli/loads';

describe('loads CLI', () => {
  it('computes the demo and renders a table in US units', () => {
    const r = runLoads(parseArgs(['seeds/demo-survey.json', '--units', 'us', '--table']));
    const text = renderTable(r, 'us');
    expect(text).toContain('psi');
    expect(text).toContain('OVER');
  });
  it('missing file and bad options give clear errors', () => {
    expect(() => runLoads(parseArgs(['no-such-file.json']))).toThrow(/no-such-file.json: file not found/);
    expect(() => parseArgs(['x.json', '--units', 'furlongs'])).toThrow(CliError);
    expect(() => parseArgs([])).toThrow(/usage/);
  });
});
