// Row builders of the revision comparison (form labels and units; changes below display precision
// kept apart). Unified diffs come from jsdiff (the `diff` package,
// createTwoFilesPatch), an independent implementation of the GNU unified format, so the line
// numbering is checked against text whose lines we know.
import { describe, expect, it } from 'vitest';
import { createTwoFilesPatch } from 'diff';
import { checkRows, coefficientRows, compareRows, designInputGroups, marginRows, parseUnifiedDiff } from '../../../src/components/RevisionDiffRows';
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

describe('rows in the form\'s words and units', () => {
  const keyPath = /\b[a-z]+[A-Z][A-Za-z]*\.[a-z]+[A-Za-z]*\b/; // e.g. dcLink.capacitanceF

  it('shows the inputs with the form\'s labels and display units, never a key path', () => {
    const design = { ...newDesignTemplate('A'), dcLink: { capacitanceF: 0.00068, voltageRefV: 200 } };
    const rows = designInputGroups(design).flatMap((g) => g.rows);
    const cap = rows.find((r) => r.key === 'dcLink.capacitanceF')!;
    expect(cap.label).toBe('DC-link capacitance');
    expect(cap.text).toBe('680 µF');
    expect(cap.exact).toBe('0.00068 F');
    expect(rows.find((r) => r.key === 'filter.inductanceH')!.text).toBe('0.6 mH');
    expect(rows.find((r) => r.key === 'currentLoop.kp')!.text).toBe('designed by rule');
    expect(rows.find((r) => r.key === 'pll.sogiGain')!.text).toBe('1.41421');
    for (const r of rows) {
      expect(r.label).not.toMatch(keyPath);
      expect(r.text).not.toMatch(/[{}]/);
    }
  });

  it('counts a change only when the shown digits change; smaller ones are "below precision"', () => {
    const before = newDesignTemplate('A');
    const after = { ...newDesignTemplate('A'), voltageLoop: { ...before.voltageLoop, crossoverHz: 12.0000001 }, dcLink: { capacitanceF: 0.0015, voltageRefV: 200 } };
    const rows = compareRows(designInputGroups(before).flatMap((g) => g.rows), designInputGroups(after).flatMap((g) => g.rows));
    const byKey = new Map(rows.map((r) => [r.key, r]));
    expect(byKey.get('dcLink.capacitanceF')!.status).toBe('changed');
    expect(byKey.get('dcLink.capacitanceF')!.after!.text).toBe('1500 µF');
    expect(byKey.get('voltageLoop.crossoverHz')!.status).toBe('below-precision');
    expect(byKey.get('voltageLoop.crossoverHz')!.after!.exact).toBe('12.0000001 Hz');
    expect(rows.filter((r) => r.status === 'changed')).toHaveLength(1);
  });

  it('marks a topology switch: fields added and removed, labelled', () => {
    const before = newDesignTemplate('A');
    const after = { ...newDesignTemplate('A'), filter: { topology: 'LCL' as const, inverterInductanceH: 0.0004, gridInductanceH: 0.0002, capacitanceF: 4.7e-6, dampingResistanceOhm: 1.5, resistanceOhm: 0.03 } };
    const rows = compareRows(designInputGroups(before).flatMap((g) => g.rows), designInputGroups(after).flatMap((g) => g.rows));
    const status = Object.fromEntries(rows.filter((r) => r.status !== 'same').map((r) => [r.label, r.status]));
    // A dropped field stays where it stood: the L inductance between the topology and the series resistance.
    const order = rows.map((r) => r.label);
    expect(order.indexOf('Inductance')).toBeGreaterThan(order.indexOf('Topology'));
    expect(order.indexOf('Inductance')).toBeLessThan(order.indexOf('Series resistance'));
    expect(status).toEqual({
      Topology: 'changed', 'Inverter-side inductance L1': 'added', 'Grid-side inductance L2': 'added', 'Filter capacitance Cf': 'added',
      'Damping resistance Rd': 'added', Inductance: 'removed',
    });
  });

  it('pairs coefficients per section, doubles to 7 digits and integers exactly', () => {
    const x = buildAnalysis();
    const y = buildAnalysis();
    y.blocks[0].sections[1].fixed.a = [16384, -32760, 16381];
    const fixed = compareRows(coefficientRows(x, 'fixed'), coefficientRows(y, 'fixed')).filter((r) => r.status === 'changed');
    expect(fixed.map((r) => [r.group, r.label, r.after!.text])).toEqual([['Current controller (PR) · resonator, fundamental', 'a (integers)', '[16384, -32760, 16381]']]);
    expect(compareRows(coefficientRows(x, 'float'), coefficientRows(y, 'float')).every((r) => r.status === 'same')).toBe(true);
    const h1 = coefficientRows(x, 'float').find((r) => r.key === 'current-pr/resonant-h1.a')!;
    expect(h1.text).toBe('[1, -1.9996, 0.9998]');
    expect(coefficientRows(x, 'float').find((r) => r.key === 'current-pr/resonant-h1.method')!.text).toBe('Tustin, prewarped');
  });

  it('shows margins in their units and checks as their messages with severity', () => {
    const x = buildAnalysis();
    const y = buildAnalysis();
    y.loops[0].phaseMarginDeg = 47.5;
    y.checks = y.checks.slice(1);
    const margins = compareRows(marginRows(x), marginRows(y)).filter((r) => r.status === 'changed');
    expect(margins.map((r) => [r.group, r.label, r.before!.text, r.after!.text])).toEqual([['Current loop (PR)', 'phase margin', '52.3°', '47.5°']]);
    const checks = compareRows(checkRows(x), checkRows(y)).filter((r) => r.status !== 'same');
    expect(checks).toHaveLength(1);
    expect(checks[0].status).toBe('removed');
    expect(checks[0].before!.text).toBe('Inductor drop is 4.8 % of grid voltage.');
    expect(checks[0].before!.severity).toBe('info');
    expect(checks[0].group).toBe('Notes (within their limits)');
  });
});
