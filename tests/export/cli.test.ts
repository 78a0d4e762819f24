import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeDesign, type DesignInput } from '../../shared/control/index';
import { L32_DESIGN } from './helpers/designs';
import { makeCheck, readZip, unpack } from './helpers/unpack';

// `npx varsmith export` end to end through bin/varsmith.mjs, on the demo designs in examples/ and on
// designs built here; the system C compiler runs every bundle's vectors.

const work = mkdtempSync(join(tmpdir(), 'varsmith-cli-'));

function cli(args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['bin/varsmith.mjs', 'export', ...args], { cwd: process.cwd(), encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

function writeDesign(name: string, design: unknown): string {
  const path = join(work, name);
  writeFileSync(path, JSON.stringify(design));
  return path;
}

const examples = readdirSync('examples').filter((f) => f.endsWith('.json')).sort();

describe('varsmith export on the demo designs', () => {
  it('the demo designs cover 16 and 32 bit, L and LCL', () => {
    const designs = examples.map((f) => JSON.parse(readFileSync(join('examples', f), 'utf8')) as DesignInput);
    expect(new Set(designs.map((d) => d.fixedPoint.wordBits))).toEqual(new Set([16, 32]));
    expect(new Set(designs.map((d) => d.filter.topology))).toEqual(new Set(['L', 'LCL']));
  });

  it.each(examples)('%s: exports (draft when it has an error check) and make check passes every vector', async (file) => {
    const design = JSON.parse(readFileSync(join('examples', file), 'utf8')) as DesignInput;
    const hasError = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 }).checks.some((c) => c.severity === 'error');
    const out = join(work, `${file}.zip`);
    const r = cli([join('examples', file), '--set-version', '2.1.0', '-o', out, ...(hasError ? ['--draft'] : [])]);
    expect(r.stderr.replace(/^warning: .*\n/gm, '')).toBe('');
    expect(r.status).toBe(0);
    const { dir, entries } = await unpack(readFileSync(out));
    const check = makeCheck(join(dir, entries[0].name));
    expect(check.output).toMatch(/^(\d+) passed, 0 failed$/m);
    expect(check.status).toBe(0);
  });
});

describe('varsmith export arguments and refusals', () => {
  it('writes the same bytes twice (constant default timestamp) and a different zip for another --timestamp', () => {
    const path = writeDesign('l32.json', L32_DESIGN);
    const a = join(work, 'a.zip');
    const b = join(work, 'b.zip');
    const c = join(work, 'c.zip');
    expect(cli([path, '--set-version', '1.0.0', '-o', a]).status).toBe(0);
    expect(cli([path, '--set-version', '1.0.0', '-o', b]).status).toBe(0);
    expect(readFileSync(a).equals(readFileSync(b))).toBe(true);
    expect(cli([path, '--set-version', '1.0.0', '-o', c, '--timestamp', '2026-05-04T03:02:00Z']).status).toBe(0);
    expect(readFileSync(c).equals(readFileSync(a))).toBe(false);
  });

  it('entries carry the documented default time stamp 2020-01-01T00:00:00Z', async () => {
    const path = writeDesign('l32-ts.json', L32_DESIGN);
    const out = join(work, 'ts.zip');
    expect(cli([path, '--set-version', '1.0.0', '-o', out]).status).toBe(0);
    const entries = await readZip(readFileSync(out));
    for (const e of entries) expect(e.modified.toISOString()).toBe('2020-01-01T00:00:00.000Z');
  });

  it('exit 2 with the key path on stderr for an invalid design, and no file written', () => {
    const bad = { ...L32_DESIGN, filter: { topology: 'L', inductanceH: -1, resistanceOhm: 0.03 } };
    const out = join(work, 'bad.zip');
    const r = cli([writeDesign('bad.json', bad), '--set-version', '1.0.0', '-o', out]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('filter.inductanceH');
    expect(r.stdout).toBe('');
    expect(readdirSync(work)).not.toContain('bad.zip');
  });

  it('exit 2 for a file that is not JSON and for a version that is not semver', () => {
    writeFileSync(join(work, 'nojson.json'), '{ nope');
    expect(cli([join(work, 'nojson.json'), '--set-version', '1.0.0', '-o', join(work, 'x.zip')]).status).toBe(2);
    const r = cli([writeDesign('ok.json', L32_DESIGN), '--set-version', 'v1', '-o', join(work, 'x.zip')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('--set-version');
    expect(cli([join(work, 'ok.json'), '--set-version', '1.0.0', '-o', join(work, 'x.zip'), '--timestamp', 'yesterday']).status).toBe(2);
  });

  it('a design with an error check is refused with exit 1 and the reason, and exported with --draft', async () => {
    // 16-bit words with a narrow resonator: the quantized resonator cannot hold its coefficients
    const design: DesignInput = { ...L32_DESIGN, name: 'Coarse word rig', fixedPoint: { wordBits: 16 }, currentLoop: { ...L32_DESIGN.currentLoop, resonantBandwidthHz: 0.05 } };
    const errors = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 }).checks.filter((c) => c.severity === 'error');
    expect(errors.length).toBeGreaterThan(0);
    const path = writeDesign('coarse.json', design);
    const out = join(work, 'coarse.zip');
    const refused = cli([path, '--set-version', '1.0.0', '-o', out]);
    expect(refused.status).toBe(1);
    expect(refused.stderr).toContain('refused');
    expect(refused.stderr).toContain(errors[0].id);
    expect(readdirSync(work)).not.toContain('coarse.zip');
    const draft = cli([path, '--set-version', '1.0.0', '-o', out, '--draft']);
    expect(draft.status).toBe(0);
    const entries = await readZip(readFileSync(out));
    for (const e of entries.filter((x) => !x.isDirectory)) expect(e.content.toString('utf8'), e.name).toContain('DRAFT');
  });
});
