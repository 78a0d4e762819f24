// Row builders of the revision comparison. Unified diffs come from jsdiff (the `diff` package,
// createTwoFilesPatch), an independent implementation of the GNU unified format, so the line
// numbering is checked against text whose lines we know.
import { describe, expect, it } from 'vitest';
import { createTwoFilesPatch } from 'diff';
import { checkRows, coefficientRows, flattenLeaves, formatCell, inputRows, marginRows, pairLeaves, parseUnifiedDiff } from '../../../src/components/RevisionDiffRows';
import { newDesignTemplate } from '../../../src/stores/designs';
import { buildAnalysis } from '../analysisFixture';

const oldHeader = Array.from({ length: 30 }, (_, i) => `#define VS_LINE_${i + 1} ${i + 1}`).join('\n') + '\n';
const newLines = oldHeader.trimEnd().split('\n');
newLines[9] = '#define VS_LINE_10 1000'; // line 10 changed
newLines.splice(20, 0, '#define VS_EXTRA 7'); // inserted as new line 21
const newHeader = newLines.join('\n') + '\n';

describe('parseUnifiedDiff', () => {
  const patch = createTwoFilesPatch('r1/coefficients.h', 'r2/coefficients.h', oldHeader, newHeader);
  const lines = parseUnifiedDiff(patch);

  it('types file, hunk, added, removed and context lines', () => {
    expect(lines.filter((l) => l.kind === 'file').map((l) => l.text)).toEqual([
      '===================================================================', '--- r1/coefficients.h', '+++ r2/coefficients.h',
    ]);
    expect(lines.filter((l) => l.kind === 'hunk').length).toBeGreaterThanOrEqual(1);
    expect(lines.filter((l) => l.kind === 'removed').map((l) => l.text)).toEqual(['-#define VS_LINE_10 10']);
    expect(lines.filter((l) => l.kind === 'added').map((l) => l.text)).toEqual(['+#define VS_LINE_10 1000', '+#define VS_EXTRA 7']);
  });

  it('numbers old and new lines as they sit in the two texts', () => {
    const removed = lines.find((l) => l.kind === 'removed')!;
    expect(removed.oldLine).toBe(10);
    expect(removed.newLine).toBeNull();
    const [changed, inserted] = lines.filter((l) => l.kind === 'added');
    expect(changed.newLine).toBe(10);
    expect(inserted.newLine).toBe(21);
    // Every context line reads the same text at its old and its new number.
    const oldRows = oldHeader.split('\n');
    const newRows = newHeader.split('\n');
    const context = lines.filter((l) => l.kind === 'context');
    expect(context.length).toBeGreaterThan(4);
    for (const l of context) {
      expect(oldRows[(l.oldLine as number) - 1]).toBe(l.text.slice(1));
      expect(newRows[(l.newLine as number) - 1]).toBe(l.text.slice(1));
    }
  });

  it('gives no lines for identical headers', () => {
    expect(parseUnifiedDiff('')).toEqual([]);
  });
});

describe('side-by-side rows', () => {
  it('flattens nested inputs and keeps number arrays whole', () => {
    const leaves = flattenLeaves(newDesignTemplate('A'));
    expect(leaves.get('filter.inductanceH')).toBe(0.0006);
    expect(leaves.get('currentLoop.harmonics')).toEqual([1, 3, 5, 7]);
    expect(leaves.get('currentLoop.kp')).toBeNull();
  });

  it('marks exactly the changed inputs, including a topology switch that adds and drops keys', () => {
    const before = newDesignTemplate('A');
    const after = { ...newDesignTemplate('A'), filter: { topology: 'LCL' as const, inverterInductanceH: 0.0004, gridInductanceH: 0.0002, capacitanceF: 4.7e-6, dampingResistanceOhm: 1.5, resistanceOhm: 0.03 } };
    const changed = inputRows(before, after).filter((r) => r.changed).map((r) => r.path).sort();
    expect(changed).toEqual(['filter.capacitanceF', 'filter.dampingResistanceOhm', 'filter.gridInductanceH', 'filter.inductanceH', 'filter.inverterInductanceH', 'filter.topology']);
    const dropped = inputRows(before, after).find((r) => r.path === 'filter.inductanceH')!;
    expect(dropped.after).toBeUndefined();
    expect(formatCell(dropped.after)).toBe('—');
  });

  it('pairs coefficients per block and section, double and integer', () => {
    const x = buildAnalysis();
    const y = buildAnalysis();
    y.blocks[0].sections[1].fixed.a = [16384, -32760, 16381];
    const fixedChanged = coefficientRows(x, y, 'fixed').filter((r) => r.changed);
    expect(fixedChanged.map((r) => r.path)).toEqual(['current-pr/resonant-h1.a']);
    expect(formatCell(fixedChanged[0].after)).toBe('[16384, -32760, 16381]');
    expect(coefficientRows(x, y, 'float').every((r) => !r.changed)).toBe(true);
  });

  it('shows margins and checks added or removed', () => {
    const x = buildAnalysis();
    const y = buildAnalysis();
    y.loops[0].phaseMarginDeg = 47.5;
    y.checks = y.checks.slice(1);
    expect(marginRows(x, y).filter((r) => r.changed).map((r) => r.path)).toEqual(['current.phaseMarginDeg']);
    const removed = checkRows(x, y).filter((r) => r.changed);
    expect(removed).toHaveLength(1);
    expect(removed[0].after).toBeUndefined();
  });

  it('treats a value going from null to a number as a change', () => {
    const rows = pairLeaves(new Map([['kp', null]]), new Map([['kp', 3.5]]));
    expect(rows[0].changed).toBe(true);
    expect(formatCell(rows[0].before)).toBe('none');
  });

  it('formats doubles to 7 significant digits and integers exactly', () => {
    expect(formatCell(1.9995734123)).toBe('1.999573');
    expect(formatCell(1073741824)).toBe('1073741824');
  });
});
