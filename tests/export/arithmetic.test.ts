import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseDesign } from '../../shared/api/design';
import { analyzeDesign, type DesignInput } from '../../shared/control/index';
import { buildBundle } from '../../server/export/index';
import { cFloat32, float32Bits } from '../../server/export/presenter';
import { makeCheck, unpack } from './helpers/unpack';

// The system C compiler running the generated code is the outside reference: every demo design of
// examples/ in 16- and 32-bit fixed point and in binary32, each with Direct Form I and with the
// quantization-robust structure, built with cc -std=c99 -Wall -Wextra -Werror -pedantic
// -ffp-contract=off, must reproduce the bit-exact model on every golden vector, block filters and
// limited steps alike; one LSB (or one ulp) off in the header must fail.

const CREATED_AT = new Date('2026-11-30T10:00:00Z');
const examples = readdirSync('examples').filter((f) => f.endsWith('.json')).sort();
const demo = (file: string): DesignInput => JSON.parse(readFileSync(join('examples', file), 'utf8')) as DesignInput;

type Variant = { label: string; fixedPoint: Partial<DesignInput['fixedPoint']> };
const VARIANTS: Variant[] = [
  { label: 'fixed16', fixedPoint: { wordBits: 16, arithmetic: 'fixed' } },
  { label: 'fixed32', fixedPoint: { wordBits: 32, arithmetic: 'fixed' } },
  { label: 'float32', fixedPoint: { wordBits: 32, arithmetic: 'float32' } },
];
const STRUCTURES = ['direct-form-1', 'quantization-robust'] as const;

function variant(design: DesignInput, v: Variant, structure: (typeof STRUCTURES)[number]): DesignInput {
  const parsed = parseDesign({ ...design, fixedPoint: { ...design.fixedPoint, ...v.fixedPoint, structure } });
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
  return parsed.design;
}

async function bundleDir(design: DesignInput): Promise<{ root: string; files: string[] }> {
  const analysis = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 });
  const bundle = await buildBundle({ design, analysis, version: '1.0.0', revision: 3, createdAt: CREATED_AT, draft: true, toolVersion: '0.1.0' });
  const { dir, entries } = await unpack(bundle.zip);
  return { root: join(dir, entries[0].name), files: entries.map((e) => e.name.slice(entries[0].name.length)) };
}

const cases = examples.flatMap((file) => VARIANTS.flatMap((v) => STRUCTURES.map((s) => [`${file} ${v.label} ${s}`, file, v, s] as const)));

describe('make check on every demo design in every arithmetic and structure', () => {
  it.each(cases)('%s', async (_label, file, v, structure) => {
    const design = variant(demo(file), v, structure);
    const { root } = await bundleDir(design);
    const count = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 }).blocks.length * 3 + 3;
    const result = makeCheck(root);
    expect(result.output).toContain(`${count} passed, 0 failed`);
    expect(result.output).not.toMatch(/warning:|error:|^FAIL /m);
    expect(result.status).toBe(0);
  });
});

describe('one ulp or one LSB off fails', () => {
  it('float32: a resonator coefficient one ulp off in the header fails the PR vectors', async () => {
    const design = variant(demo('sc3-bench-l-120v.json'), VARIANTS[2], 'direct-form-1');
    const analysis = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 });
    const h1 = analysis.blocks.find((b) => b.id === 'current-pr')!.sections.find((s) => s.role === 'resonant-h1')!;
    const a1 = h1.float32!.coefficients[3];
    const view = new DataView(new ArrayBuffer(4));
    view.setUint32(0, float32Bits(a1) - 1);
    const nextDown = view.getFloat32(0);
    expect(Math.abs(nextDown)).toBeLessThan(Math.abs(a1));
    const { root, files } = await bundleDir(design);
    const header = join(root, files.find((f) => f.endsWith('_coefs.h'))!);
    const text = readFileSync(header, 'utf8');
    const line = `_CURRENT_PR_RESONANT_H1_A1 ${cFloat32(a1)}\n`;
    expect(text).toContain(line);
    writeFileSync(header, text.replace(line, `_CURRENT_PR_RESONANT_H1_A1 ${cFloat32(nextDown)}\n`));
    const result = makeCheck(root);
    expect(result.status).not.toBe(0);
    expect(result.output).toMatch(/FAIL current-pr\//);
    expect(result.output).not.toMatch(/FAIL (voltage-pi|pll-pi|sogi-d|sogi-q|reactive-lpf)\/(step|chirp|noise)/);
  });

  it('16-bit delta-operator form: c1 of the h1 resonator one LSB off fails the PR vectors', async () => {
    const design = variant(demo('sc2-port-16bit-230v.json'), VARIANTS[0], 'quantization-robust');
    const { root, files } = await bundleDir(design);
    const header = join(root, files.find((f) => f.endsWith('_coefs.h'))!);
    const text = readFileSync(header, 'utf8');
    const pattern = /(#define \w+_CURRENT_PR_RESONANT_H1_C1 )INT32_C\((\d+)\)/;
    const match = pattern.exec(text);
    expect(match).not.toBeNull();
    writeFileSync(header, text.replace(pattern, (_m, head: string, n: string) => `${head}INT32_C(${Number(n) + 1})`));
    const result = makeCheck(root);
    expect(result.status).not.toBe(0);
    expect(result.output).toMatch(/FAIL current-pr\//);
  });
});

describe('single precision needs float evaluation in float', () => {
  it('the float32 header refuses a target whose FLT_EVAL_METHOD is not 0', async () => {
    const design = variant(demo('sc5-field-lcl-240v.json'), VARIANTS[2], 'direct-form-1');
    const { root, files } = await bundleDir(design);
    const header = files.find((f) => f.endsWith('_coefs.h'))!.split('/').pop()!;
    const probe = (method: string): { status: number | null; stderr: string } => {
      writeFileSync(join(root, 'probe.c'), `#include <float.h>\n#undef FLT_EVAL_METHOD\n#define FLT_EVAL_METHOD ${method}\n#include "${header}"\nint main(void) { return 0; }\n`);
      const r = spawnSync('cc', ['-std=c99', '-Wall', '-Wextra', '-Werror', '-pedantic', '-Iinclude', '-o', 'probe', 'probe.c'], { cwd: root, encoding: 'utf8' });
      return { status: r.status, stderr: r.stderr };
    };
    expect(probe('0').status).toBe(0);
    const wide = probe('2');
    expect(wide.status).not.toBe(0);
    expect(wide.stderr).toMatch(/FLT_EVAL_METHOD == 0/);
  });
});

// A 32-bit ARM target under user-mode emulation gives the same bits as the host (IEEE 754 binary32
// on the VFP, 64-bit integer arithmetic in software): skipped where the cross compiler is absent.
const arm = spawnSync('arm-linux-gnueabihf-gcc', ['--version']).status === 0 && spawnSync('qemu-arm', ['--version']).status === 0;
describe.skipIf(!arm)('the same bits on a 32-bit ARM target (qemu-arm)', () => {
  it.each([['float32', 2, 'quantization-robust'], ['fixed32', 1, 'quantization-robust'], ['fixed16', 0, 'direct-form-1']] as const)('%s', async (_label, index, structure) => {
    const design = variant(demo('sc5-field-lcl-240v.json'), VARIANTS[index], structure);
    const { root } = await bundleDir(design);
    const r = spawnSync('make', ['-s', 'check', 'CC=arm-linux-gnueabihf-gcc', 'RUN=qemu-arm -L /usr/arm-linux-gnueabihf'], { cwd: root, encoding: 'utf8' });
    expect(`${r.stdout}${r.stderr}`).toContain('21 passed, 0 failed');
    expect(r.status).toBe(0);
  });
});
