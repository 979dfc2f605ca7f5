/**
 * The command-line analyser end to end, as a user runs it: a real child process on the committed
 * workbooks. The expected impacts of the worked example are the hand computation of
 * docs/methods.md (WORKED_EXAMPLE_EXPECTED); the demo's hidden shared tier-2 suppliers are the
 * ones tools/demo-network.ts builds on purpose.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..');
const workdir = mkdtempSync(join(tmpdir(), 'keelson-analyze-'));

function analyze(...args: string[]) {
  return spawnSync(process.execPath, ['--import', 'tsx', 'tools/analyze.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
    timeout: 120_000,
  });
}

describe('npm run analyze', () => {
  it('writes the contract JSON for the demo workbook, suppliers sorted by code', () => {
    const out = join(workdir, 'demo.json');
    const run = analyze('data/demo/keelson-demo.xlsx', '--json', out, '--top', '5');
    expect(run.status).toBe(0);
    expect(run.stdout).toContain('single points of failure');
    const json = JSON.parse(readFileSync(out, 'utf8'));
    const codes: string[] = json.suppliers.map((s: { code: string }) => s.code);
    expect(codes).toEqual([...codes].sort());
    for (const field of ['code', 'tier', 'productsLost', 'revenueExposedPerWeek', 'revenueImpact',
      'singlePointOfFailure', 'betweenness', 'degree', 'closeness', 'eigenvector', 'pagerank']) {
      expect(json.suppliers[0]).toHaveProperty(field);
    }
    expect(json.scenario).toBeUndefined();
    expect(json.methods.closeness).toEqual({ method: 'exact' });
    // The demo hides two tier-2 single points of failure under dual-sourced items.
    const shared = json.suppliers.filter((s: { code: string }) => s.code.startsWith('S-2-SHARED'));
    expect(shared.map((s: { tier: number; singlePointOfFailure: boolean }) => [s.tier, s.singlePointOfFailure]))
      .toEqual([[2, true], [2, true]]);
  });

  it('adds the scenario for --fail and --fail-country, as their union', () => {
    const out = join(workdir, 'scenario.json');
    const run = analyze('data/demo/keelson-demo.xlsx', '--json', out, '--fail', 'S-1-001', '--fail-country', ' cz ');
    expect(run.status).toBe(0);
    const json = JSON.parse(readFileSync(out, 'utf8'));
    const czech = json.suppliers.filter((s: { country: string }) => s.country === 'CZ').map((s: { code: string }) => s.code);
    expect(json.scenario.failed).toEqual([...new Set(['S-1-001', ...czech])].sort());
    expect(json.scenario.revenueImpact).toBeGreaterThan(0);
  });

  it('estimates closeness from pivots with --closeness sampled, and says so', () => {
    const exactOut = join(workdir, 'exact.json');
    const sampledOut = join(workdir, 'sampled.json');
    expect(analyze('data/demo/keelson-demo.xlsx', '--json', exactOut).status).toBe(0);
    const run = analyze('data/demo/keelson-demo.xlsx', '--json', sampledOut, '--closeness', 'sampled');
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/Closeness estimated from \d+ pivots/);
    const exact = JSON.parse(readFileSync(exactOut, 'utf8'));
    const sampled = JSON.parse(readFileSync(sampledOut, 'utf8'));
    expect(sampled.methods.closeness.method).toBe('sampled');
    // The demo network is small: the pivots cover every node, so the estimate is exact.
    expect(sampled.methods.closeness.maxRelativeStandardError).toBe(0);
    sampled.suppliers.forEach((s: { closeness: number }, i: number) =>
      expect(s.closeness).toBeCloseTo(exact.suppliers[i].closeness, 12));
    expect(analyze('data/demo/keelson-demo.xlsx', '--closeness', 'fast').status).toBe(2);
  });

  it('exits 2 naming a --fail code that is not a supplier', () => {
    const run = analyze('data/examples/worked-example.xlsx', '--fail', 'NOPE-1');
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('NOPE-1');
  });

  it('exits 1 on a bad workbook and writes its located errors to --json', () => {
    const bad = join(workdir, 'bad.csv');
    writeFileSync(bad, 'plant_code,plant_name\nP1,One\n');
    const out = join(workdir, 'bad.json');
    const run = analyze(bad, '--json', out);
    expect(run.status).toBe(1);
    const json = JSON.parse(readFileSync(out, 'utf8'));
    expect(json.errors.length).toBeGreaterThan(0);
    expect(json.errors[0]).toHaveProperty('sheet');
    expect(json.errors[0]).toHaveProperty('message');
    expect(run.stderr).toContain('error');
  });

  it('prints usage and exits 2 without a workbook', () => {
    expect(analyze().status).toBe(2);
    expect(execFileSync(process.execPath, ['--import', 'tsx', 'tools/analyze.ts', '--help'], { cwd: root, encoding: 'utf8' }))
      .toContain('Usage');
  });
});
