// `npx varsmith simulate` (CONTRACT section 10): the varsmith-simulation/1 JSON on stdout, exit 0, or
// 2 on invalid input with the flag named on stderr.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../', import.meta.url));
const run = (...args: string[]) => spawnSync(process.execPath, [join(root, 'bin/varsmith.mjs'), 'simulate', ...args], { cwd: root, encoding: 'utf8' });

describe('varsmith simulate', () => {
  it('prints the result of a switched voltage sag with the contract\'s keys and exits 0', { timeout: 60000 }, () => {
    const r = run('examples/sc3-bench-l-120v.json', '--scenario', 'voltage-sag', '--model', 'switched', '--duration', '0.2', '--trace-points', '100');
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.format).toBe('varsmith-simulation/1');
    expect(out).toMatchObject({ scenario: 'voltage-sag', model: 'switched', sampleTimeS: 5e-5 });
    expect(out.durationS).toBeCloseTo(0.2, 12);
    for (const key of ['activePowerW', 'reactivePowerVar']) expect(typeof out.load[key]).toBe('number');
    for (const key of ['gridPowerFactor', 'gridActivePowerW', 'gridReactivePowerVar', 'loadReactivePowerVar', 'gridCurrentThdPercent', 'gridCurrentHarmonicsPercent',
      'dcLinkMeanV', 'dcLinkRipplePeakToPeakV', 'peakInverterCurrentA', 'pllFrequencyHz', 'settlingTimeS']) expect(out.metrics).toHaveProperty(key);
    expect(Object.keys(out.metrics.gridCurrentHarmonicsPercent)).toContain('3');
    expect(out.traces.timeS.length).toBeLessThanOrEqual(100);
  });

  // Each call starts Node and compiles the sources: three calls cover a schema rule, a rule that
  // needs the design (10 grid cycles at least), and the design itself.
  it('exits 2 on invalid input, naming the flag or the design key', { timeout: 90000 }, () => {
    const bad = (args: string[], pattern: RegExp) => {
      const r = run(...args);
      expect(r.status, r.stderr).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(pattern);
    };
    bad(['examples/sc3-bench-l-120v.json', '--scenario', 'blackout', '--model', 'detailed'], /--scenario: must be one of[\s\S]*--model: must be/);
    bad(['examples/sc3-bench-l-120v.json', '--scenario', 'steady', '--duration', '0.01'], /--duration must be a number of seconds in \[0\.1667, 10\]/);
    const dir = mkdtempSync(join(tmpdir(), 'varsmith-sim-'));
    const design = JSON.parse(readFileSync(join(root, 'examples/sc3-bench-l-120v.json'), 'utf8'));
    design.dcLink.capacitanceF = 0;
    writeFileSync(join(dir, 'bad.json'), JSON.stringify(design));
    bad([join(dir, 'bad.json'), '--scenario', 'steady'], /dcLink\.capacitanceF/);
  });
});
