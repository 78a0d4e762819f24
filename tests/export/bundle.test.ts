import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { analyzeDesign, type AnalysisResult, type DesignInput } from '../../shared/control/index';
import { buildBundle, canonicalJson, renderCoefficientHeader, sha256Hex, type BundleInput } from '../../server/export/index';
import { L32_DESIGN, LCL16_DESIGN } from './helpers/designs';
import { makeCheck, readZip, unpack } from './helpers/unpack';

// The system C compiler running the generated code is the outside reference for the arithmetic:
// it executes the exported C99 source on the golden vectors of the bit-exact model.

const CREATED_AT = new Date('2026-11-30T10:00:00Z');

function analysisFor(design: DesignInput): AnalysisResult {
  return analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 });
}

function input(design: DesignInput, over: Partial<BundleInput> = {}): BundleInput {
  return { design, analysis: analysisFor(design), version: '1.4.0', revision: 7, createdAt: CREATED_AT, draft: false, toolVersion: '0.1.0', ...over };
}

/** A design not in the repository whose name stresses every escaping rule (comment end, quotes, trigraph, non-ASCII, leading digit). */
const AWKWARD_DESIGN: DesignInput = {
  ...L32_DESIGN,
  name: '2nd "rig" */ ??= Ünïcode \\ test',
  currentLoop: { ...L32_DESIGN.currentLoop, harmonics: [1, 3, 5, 7, 9, 11], resonantBandwidthHz: 1 },
  fixedPoint: { wordBits: 16 },
};

const DESIGNS: [string, DesignInput][] = [
  ['L, 32 bit, 4 harmonics', L32_DESIGN],
  ['LCL, 16 bit, ideal resonators', LCL16_DESIGN],
  ['L, 16 bit, 6 harmonics, awkward name', AWKWARD_DESIGN],
];

describe('make check on exported bundles', () => {
  it.each(DESIGNS)('%s: every golden vector passes in C', async (_label, design) => {
    const bundle = await buildBundle(input(design));
    const { dir, entries } = await unpack(bundle.zip);
    const root = entries[0].name;
    const result = makeCheck(join(dir, root));
    // three per block (step, chirp, noise) and three limited steps (DC-link PI, PLL PI, PR)
    const vectorCount = analysisFor(design).blocks.length * 3 + 3;
    expect(result.output).toContain(`${vectorCount} passed, 0 failed`);
    expect(result.output).not.toMatch(/warning:|error:|^FAIL /m);
    expect(result.output.match(/^PASS /gm)?.length).toBe(vectorCount);
    expect(result.status).toBe(0);
  });

  it('the reference code runs every vector without undefined behaviour (UBSan: signed overflow, shifts)', async () => {
    for (const design of [L32_DESIGN, LCL16_DESIGN]) {
      const bundle = await buildBundle(input(design));
      const { dir, entries } = await unpack(bundle.zip);
      const root = join(dir, entries[0].name);
      const sources = entries.filter((e) => e.name.endsWith('.c')).map((e) => e.name.slice(entries[0].name.length));
      const build = spawnSync('cc', ['-std=c99', '-Wall', '-Wextra', '-Werror', '-pedantic', '-O1', '-fsanitize=undefined', '-fno-sanitize-recover=all', '-Iinclude', '-Itest', '-o', 'run_ub', ...sources], { cwd: root, encoding: 'utf8' });
      expect(build.stderr).toBe('');
      expect(build.status).toBe(0);
      const run = spawnSync('./run_ub', [], { cwd: root, encoding: 'utf8' });
      expect(run.stderr).toBe('');
      expect(run.stdout).toContain('21 passed, 0 failed');
      expect(run.status).toBe(0);
    }
  });

  it('a coefficient one LSB off in the header fails the vectors of its block (every block of a 32-bit design)', async () => {
    const bundle = await buildBundle(input(L32_DESIGN));
    const analysis = analysisFor(L32_DESIGN);
    for (const block of analysis.blocks) {
      const { dir, entries } = await unpack(bundle.zip);
      const header = entries.find((e) => e.name.endsWith('_coefs.h'));
      expect(header).toBeDefined();
      const path = join(dir, header!.name);
      const text = readFileSync(path, 'utf8');
      const token = block.id.replace(/-/g, '_').toUpperCase();
      // first section's B0 (non-zero in every block of this design)
      const pattern = new RegExp(`(#define \\w+_${token}_\\w+?_B0 )(\\(-)?INT32_C\\((\\d+)\\)`);
      const match = pattern.exec(text);
      expect(match, block.id).not.toBeNull();
      const code = Number(match![3]);
      expect(code).toBeGreaterThan(0);
      const changed = text.replace(pattern, (_m, head: string, neg: string | undefined) => `${head}${neg ?? ''}INT32_C(${code + 1})`);
      expect(changed).not.toBe(text);
      writeFileSync(path, changed);
      const result = makeCheck(join(dir, entries[0].name));
      expect(result.status, block.id).not.toBe(0);
      const summary = /(\d+) passed, (\d+) failed/.exec(result.output);
      expect(summary, result.output).not.toBeNull();
      expect(Number(summary![2]), block.id).toBeGreaterThanOrEqual(1);
      expect(result.output).toMatch(new RegExp(`FAIL ${block.id}/`));
    }
  });

  it('a 16-bit resonator coefficient one LSB off fails make check', async () => {
    const bundle = await buildBundle(input(LCL16_DESIGN));
    const { dir, entries } = await unpack(bundle.zip);
    const header = entries.find((e) => e.name.endsWith('_coefs.h'))!;
    const path = join(dir, header.name);
    const text = readFileSync(path, 'utf8');
    const pattern = /(#define \w+_CURRENT_PR_RESONANT_H1_A1 )\(-INT32_C\((\d+)\)\)/;
    const match = pattern.exec(text);
    expect(match).not.toBeNull();
    writeFileSync(path, text.replace(pattern, (_m, head: string, n: string) => `${head}(-INT32_C(${Number(n) - 1}))`));
    const result = makeCheck(join(dir, entries[0].name));
    expect(result.status).not.toBe(0);
    expect(result.output).toMatch(/FAIL current-pr\//);
    expect(result.output).toMatch(/\d+ passed, [1-9]\d* failed/);
  });
});

describe('bundle bytes and manifest', () => {
  it('two exports of the same input are byte-identical; another revision time changes the bytes', async () => {
    const a = await buildBundle(input(LCL16_DESIGN));
    const b = await buildBundle(input(LCL16_DESIGN));
    expect(a.zip.equals(b.zip)).toBe(true);
    expect(a.sha256).toBe(b.sha256);
    expect(a.sha256).toBe(sha256Hex(a.zip));
    const c = await buildBundle(input(LCL16_DESIGN, { createdAt: new Date('2026-11-30T10:00:04Z') }));
    expect(c.zip.equals(a.zip)).toBe(false);
  });

  it('the zip does not depend on the time zone of the machine', () => {
    // Node decides the zone at start-up, so the export runs in child processes with different TZ.
    const script = `import { buildBundle } from './server/export/index';
import { analyzeDesign } from './shared/control/index';
import { LCL16_DESIGN } from './tests/export/helpers/designs';
const b = await buildBundle({ design: LCL16_DESIGN, analysis: analyzeDesign(LCL16_DESIGN, { sweepPoints: 0, responseSamples: 0 }), version: '1.4.0', revision: 7, createdAt: new Date('2026-11-30T23:30:00Z'), draft: false, toolVersion: '0.1.0' });
process.stdout.write(b.sha256);`;
    const run = (tz: string): string => {
      const r = spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], { cwd: process.cwd(), env: { ...process.env, TZ: tz }, encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      return r.stdout;
    };
    const utc = run('UTC');
    expect(utc).toMatch(/^[0-9a-f]{64}$/);
    expect(run('Pacific/Kiritimati')).toBe(utc);
    expect(run('America/St_Johns')).toBe(utc);
  });

  it('entries are sorted under <slug>-<version>/ with fixed modes and the revision time', async () => {
    const bundle = await buildBundle(input(L32_DESIGN));
    expect(bundle.fileName).toBe('harbour-test-rig-a-1.4.0.zip');
    const entries = await readZip(bundle.zip);
    const names = entries.map((e) => e.name);
    expect(names).toEqual([...names].sort());
    expect(names[0]).toBe('harbour-test-rig-a-1.4.0/');
    expect(names.every((n) => n.startsWith('harbour-test-rig-a-1.4.0/'))).toBe(true);
    for (const dir of ['include/', 'src/', 'test/']) expect(names).toContain(`harbour-test-rig-a-1.4.0/${dir}`);
    for (const file of ['Makefile', 'REPORT.md', 'manifest.json', 'test/run_vectors.c', 'include/harbour-test-rig-a_coefs.h', 'src/harbour-test-rig-a_filter.c']) {
      expect(names).toContain(`harbour-test-rig-a-1.4.0/${file}`);
    }
    for (const e of entries) {
      expect(e.mode, e.name).toBe(e.isDirectory ? 0o755 : 0o644);
      expect(e.modified.toISOString(), e.name).toBe(CREATED_AT.toISOString());
    }
  });

  it('every manifest hash matches its file and every other file is listed', async () => {
    const design = LCL16_DESIGN;
    const bundle = await buildBundle(input(design));
    const entries = await readZip(bundle.zip);
    const root = entries[0].name;
    const manifestEntry = entries.find((e) => e.name === `${root}manifest.json`)!;
    const manifest = JSON.parse(manifestEntry.content.toString('utf8')) as { format: string; design: string; version: string; revision: number; toolVersion: string; inputs: unknown; inputsSha256: string; files: { path: string; sha256: string; bytes: number }[] };
    expect(manifest).toMatchObject({ format: 'varsmith-manifest/1', design: design.name, version: '1.4.0', revision: 7, toolVersion: '0.1.0' });
    expect(manifest.inputs).toEqual(design);
    expect(manifest.inputsSha256).toBe(sha256Hex(canonicalJson(design)));
    expect(bundle.manifest).toEqual(manifest);
    const files = entries.filter((e) => !e.isDirectory && e.name !== manifestEntry.name);
    expect(manifest.files.map((f) => `${root}${f.path}`).sort()).toEqual(files.map((f) => f.name).sort());
    for (const f of files) {
      const listed = manifest.files.find((m) => `${root}${m.path}` === f.name)!;
      expect(listed.sha256, f.name).toBe(sha256Hex(f.content));
      expect(listed.bytes, f.name).toBe(f.content.length);
    }
  });

  it('the inputs hash ignores key order (canonical JSON)', () => {
    const reverseKeys = (v: unknown): unknown => (v !== null && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).reverse().map(([k, x]) => [k, reverseKeys(x)])) : v);
    const reordered = reverseKeys(L32_DESIGN) as DesignInput;
    expect(Object.keys(reordered)[0]).not.toBe(Object.keys(L32_DESIGN)[0]);
    expect(canonicalJson(reordered)).toBe(canonicalJson(L32_DESIGN));
    expect(canonicalJson({ b: [1, { d: 2, c: null }], a: 'x' })).toBe('{"a":"x","b":[1,{"c":null,"d":2}]}');
  });
});

describe('DRAFT, safety caution and header', () => {
  it('a draft export stamps DRAFT into every file and its name', async () => {
    const bundle = await buildBundle(input(LCL16_DESIGN, { draft: true, revision: null, version: '0.0.0-draft.3' }));
    expect(bundle.fileName).toBe('3kw-island-grid-lcl-16-0.0.0-draft.3-draft.zip');
    const entries = await readZip(bundle.zip);
    const files = entries.filter((e) => !e.isDirectory);
    expect(files.length).toBe(9);
    for (const f of files) expect(f.content.toString('utf8'), f.name).toContain('DRAFT');
    const { dir } = await unpack(bundle.zip);
    const result = makeCheck(join(dir, entries[0].name));
    expect(result.output).toContain('DRAFT: not a released set');
    expect(result.status).toBe(0);
  });

  it('the safety caution is in the header comment, the C source and the report', async () => {
    const bundle = await buildBundle(input(L32_DESIGN));
    const entries = await readZip(bundle.zip);
    for (const suffix of ['_coefs.h', '_filter.c', 'REPORT.md']) {
      const text = entries.find((e) => e.name.endsWith(suffix))!.content.toString('utf8');
      expect(text, suffix).toContain('SAFETY CAUTION');
      expect(text, suffix).toContain('current-limited bench or hardware-in-the-loop rig');
      expect(text, suffix).toContain('IEEE 1547');
    }
  });

  it('REPORT.md lists every section with its Q format and integers, every loop margin and every check', async () => {
    const analysis = analysisFor(LCL16_DESIGN);
    const bundle = await buildBundle(input(LCL16_DESIGN));
    const entries = await readZip(bundle.zip);
    const report = entries.find((e) => e.name.endsWith('REPORT.md'))!.content.toString('utf8');
    for (const block of analysis.blocks) {
      expect(report).toContain(`### ${block.id} (${block.method}, g = `);
      for (const s of block.sections) {
        expect(report).toContain(`**${s.role}** (${s.kind}), ${s.fixed.qFormat}, F = ${s.fixed.fracBits}, direct-form-1`);
        // the integers quantize the scaled doubles (CONTRACT section 7)
        const real = s.scaled!.b[0];
        expect(report).toContain(`| B0 | ${String(real).includes('.') || String(real).includes('e') ? String(real) : `${real}.0`} | ${s.fixed.b[0]} |`);
      }
    }
    for (const loop of analysis.loops) expect(report).toMatch(new RegExp(`^\\| ${loop.id} \\| `, 'm'));
    for (const check of analysis.checks) expect(report).toContain(`| ${check.severity} | ${check.id} |`);
    const errors = analysis.checks.filter((c) => c.severity === 'error');
    for (const e of errors) expect(report).toContain(`ERROR ${e.id}`);
  });

  it('renderCoefficientHeader gives the bundle header byte for byte and holds guard, version, revision, hash and scaling', async () => {
    const meta = { version: '1.4.0', revision: 7, draft: false, toolVersion: '0.1.0', createdAt: CREATED_AT };
    const header = renderCoefficientHeader(L32_DESIGN, analysisFor(L32_DESIGN), meta);
    const bundle = await buildBundle(input(L32_DESIGN));
    const entries = await readZip(bundle.zip);
    expect(entries.find((e) => e.name.endsWith('_coefs.h'))!.content.toString('utf8')).toBe(header);
    expect(header).toMatch(/#ifndef (\w+_COEFS_H)\n#define \1\n/);
    expect(header).toContain('revision:      7');
    expect(header).toContain('"1.4.0"');
    expect(header).toContain(sha256Hex(canonicalJson(L32_DESIGN)));
    for (const name of ['VOLTAGE_BASE_V', 'CURRENT_BASE_A', 'REACTIVE_FACTOR 2.0', 'FEEDFORWARD']) expect(header).toContain(`_SCALE_${name}`);
    expect(header).toMatch(/CURRENT_PR_RESONANT_H7_B0 /);
    expect(header).toMatch(/Q format Q2\.30/);
  });

  it('the header alone compiles without warnings under -std=c99 -Wall -Wextra -Werror -pedantic', async () => {
    const bundle = await buildBundle(input(AWKWARD_DESIGN));
    const { dir, entries } = await unpack(bundle.zip);
    const root = join(dir, entries[0].name);
    const header = entries.find((e) => e.name.endsWith('_coefs.h'))!.name.split('/').pop()!;
    writeFileSync(join(root, 'only_header.c'), `#include "${header}"\n#include "${header}"\nint main(void) { return 0; }\n`);
    const r = spawnSync('cc', ['-std=c99', '-Wall', '-Wextra', '-Werror', '-pedantic', '-Iinclude', '-o', 'only_header', 'only_header.c'], { cwd: root, encoding: 'utf8' });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
  });
});
