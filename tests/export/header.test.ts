import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeDesign, blockSignals, conversionConstants, type DesignInput } from '../../shared/control/index';
import { buildBundle, renderCoefficientHeader } from '../../server/export/index';
import { makeCheck, unpack } from './helpers/unpack';

// What a firmware engineer reads first: the signal table, the conversion constants in stated Q
// formats, the limits, and C names that survive a rename. Checked against the core's own signal
// map (CONTRACT section 7) and by the C compiler.

const META = { version: '1.0.0', revision: 2, draft: false, toolVersion: '0.1.0', createdAt: new Date('2026-11-30T10:00:00Z') };
const sc3 = JSON.parse(readFileSync('examples/sc3-bench-l-120v.json', 'utf8')) as DesignInput;
const analysisOf = (d: DesignInput) => analyzeDesign(d, { sweepPoints: 0, responseSamples: 0 });

// C source with every comment and string literal removed.
function code(text: string): string {
  return text.replace(/\/\*[\s\S]*?\*\//g, ' ').replace(/"(?:[^"\\]|\\.)*"/g, '""');
}

describe('signal table and constants of the header', () => {
  const header = renderCoefficientHeader(sc3, analysisOf(sc3), META);

  it('opens with the signal table: every block with its input, output, unit, base and Q format', () => {
    const lines = header.split('\n');
    expect(lines[0]).toBe('/*');
    const tableStart = lines.findIndex((l) => /^ \*\s+block\s+input\s+output\s+unit/.test(l));
    expect(tableStart).toBeGreaterThan(0);
    expect(tableStart).toBeLessThan(8);
    for (const s of blockSignals(sc3)) {
      const row = lines.slice(tableStart + 1, tableStart + 7).find((l) => l.startsWith(` *   ${s.blockId} `));
      expect(row, s.blockId).toBeDefined();
      expect(row).toContain(s.input.quantity);
      expect(row).toContain(s.output.quantity);
      expect(row).toContain(`${s.input.unit} -> ${s.output.unit}`);
      expect(row).toContain('Q3.29');
    }
    // SC-3: Ibase = sqrt(2) 3300 / 120 = 38.8909 A, VdcBase = 200 V (hand arithmetic)
    expect(lines.find((l) => l.startsWith(' *   current-pr '))).toContain('Ibase = 38.8909 A -> VdcBase = 200 V');
  });

  it('states every conversion constant as an integer in its Q format, its shift and the double', () => {
    const k = conversionConstants(sc3);
    const cases: [string, number][] = [
      ['ADC_CURRENT_PER_CODE', k.currentPerCode], ['ADC_GRID_VOLTAGE_PER_CODE', k.gridVoltagePerCode], ['ADC_DC_VOLTAGE_PER_CODE', k.dcVoltagePerCode],
      ['PWM_COUNTS_PER_MODULATION', k.countsPerModulation], ['FEEDFORWARD_FACTOR', k.feedForwardFactor], ['REACTIVE_FACTOR', 2],
    ];
    for (const [name, value] of cases) {
      const int = new RegExp(`#define \\w+_${name} INT32_C\\((\\d+)\\) /\\* Q(-?\\d+)\\.(\\d+),`).exec(header);
      const shift = new RegExp(`#define \\w+_${name}_SHIFT (\\d+)`).exec(header);
      expect(int, name).not.toBeNull();
      expect(shift, name).not.toBeNull();
      expect(Number(int![3])).toBe(Number(shift![1]));
      expect(Number(int![2]) + Number(int![3])).toBe(32);
      // the integer stands for the value to within half an LSB of its format, and uses the word (largest F)
      const code = Number(int![1]);
      expect(Math.abs(code / 2 ** Number(shift![1]) - value)).toBeLessThanOrEqual(2 ** -(Number(shift![1]) + 1));
      expect(code).toBeGreaterThanOrEqual(2 ** 30);
      expect(header).toMatch(new RegExp(`#define \\w+_${name}_REAL `));
    }
    // 12-bit ADC, full scale 2 x Ibase: 2 / 2048 pu per code = 2^-10, exactly 2^30 in
    expect(header).toMatch(/_ADC_CURRENT_PER_CODE INT32_C\(1073741824\) \/\* Q-8\.40,/);
  });

  it('holds the three limits in the signal word', () => {
    // 1.2 pu in Q3.29 = round(1.2 * 2^29) = 644245094; 0.1 pu = 53687091; 0.95 pu = 510027366
    expect(header).toMatch(/_LIMIT_CURRENT_REFERENCE INT32_C\(644245094\)/);
    expect(header).toMatch(/_LIMIT_PLL_FREQUENCY INT32_C\(53687091\)/);
    expect(header).toMatch(/_LIMIT_MODULATION INT32_C\(510027366\)/);
  });
});

describe('every demo design states every block\'s signals', () => {
  const examples = readdirSync('examples').filter((f) => f.endsWith('.json')).sort();
  it.each(examples)('%s', (file) => {
    const design = JSON.parse(readFileSync(join('examples', file), 'utf8')) as DesignInput;
    const header = renderCoefficientHeader(design, analysisOf(design), META);
    const lines = header.split('\n');
    const format = design.fixedPoint.wordBits === 16 ? 'Q3.13' : 'Q3.29';
    for (const s of blockSignals(design)) {
      const row = lines.find((l) => l.startsWith(` *   ${s.blockId} `));
      expect(row, s.blockId).toBeDefined();
      for (const part of [s.input.quantity, s.output.quantity, `${s.input.unit} -> ${s.output.unit}`, format]) expect(row, `${s.blockId}: ${part}`).toContain(part);
    }
  });
});

describe('a stable C prefix', () => {
  const named = (name: string): DesignInput => ({ ...sc3, name, firmware: { symbolPrefix: 'SC3' } });

  it('names every function and macro after firmware.symbolPrefix and keeps the display name in comments only', async () => {
    const design = named('Quay 4 rig "B" */ #define X');
    const bundle = await buildBundle({ design, analysis: analysisOf(design), ...META });
    const { dir, entries } = await unpack(bundle.zip);
    const root = join(dir, entries[0].name);
    const sources = entries.filter((e) => /\.[ch]$/.test(e.name));
    expect(sources.map((e) => e.name.slice(entries[0].name.length)).sort()).toEqual(['include/sc3_coefs.h', 'include/sc3_filter.h', 'src/sc3_filter.c', 'test/run_vectors.c', 'test/sc3_vectors.c', 'test/sc3_vectors.h']);
    let macros = 0;
    let definitions = 0;
    for (const e of sources) {
      const text = readFileSync(join(dir, e.name), 'utf8');
      const stripped = code(text);
      expect(stripped, e.name).not.toContain('Quay');
      for (const m of stripped.matchAll(/#define (\w+)/g)) {
        expect(m[1], e.name).toMatch(/^SC3_/);
        macros += 1;
      }
      for (const m of stripped.matchAll(/^(?:static )?(?:const )?(?:struct \w+ |int32_t |int64_t |float |void |sc3_word )+\**(\w+)\s*[([=]/gm)) {
        expect(m[1], e.name).toMatch(/^(sc3_|main$)/);
        definitions += 1;
      }
    }
    expect(macros).toBeGreaterThan(100);
    expect(definitions).toBeGreaterThan(20);
    const header = readFileSync(join(root, 'include/sc3_coefs.h'), 'utf8');
    expect(header).toContain('C prefix sc3 / SC3: the design\'s firmware symbol prefix (stable across renames).');
    expect(header).toContain('"Quay 4 rig "B" * / #define X"');
    expect(makeCheck(root).output).toContain('21 passed, 0 failed');
  });

  it('renaming the design changes no identifier of the C code', () => {
    const identifiers = (d: DesignInput): string[] => [...new Set(code(renderCoefficientHeader(d, analysisOf(d), META)).match(/\b[A-Za-z_]\w*\b/g) ?? [])].sort();
    expect(identifiers(named('Quay 4 rig'))).toEqual(identifiers(named('Harbour bench, renamed')));
    // without a prefix the names follow the display name, and the analysis says so
    const a = { ...sc3, name: 'Quay 4 rig' };
    const b = { ...sc3, name: 'Harbour bench, renamed' };
    expect(identifiers(a)).not.toEqual(identifiers(b));
    expect(analysisOf(a).checks.find((c) => c.id === 'firmware-symbol-prefix')).toMatchObject({ severity: 'info' });
    expect(analysisOf(named('x')).checks.find((c) => c.id === 'firmware-symbol-prefix')).toBeUndefined();
    expect(renderCoefficientHeader(a, analysisOf(a), META)).toContain('derived from the display name; renaming the design changes every name');
  });
});
