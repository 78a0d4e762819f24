// The analysis tables: findings ordered by severity, loops with the unstable one flagged,
// where each resonance lands per method, fixed-point rows highlighted by their section's checks.
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import AnalysisFindings from '../../../src/components/AnalysisFindings.vue';
import AnalysisLoopTable from '../../../src/components/AnalysisLoopTable.vue';
import AnalysisResonanceTable from '../../../src/components/AnalysisResonanceTable.vue';
import AnalysisWordTable from '../../../src/components/AnalysisWordTable.vue';
import { designedGainTexts } from '../../../src/composables/analysisView';
import { buildAnalysis } from '../analysisFixture';

const global = { plugins: [Quasar] };

describe('analysis tables', () => {
  it('lists errors first with value, limit and remedy; info notes fold behind one row', async () => {
    const wrapper = mount(AnalysisFindings, { props: { checks: buildAnalysis().checks }, global });
    expect(wrapper.findAll('[data-severity]').map((i) => i.attributes('data-severity'))).toEqual(['error', 'warning']);
    const toggle = wrapper.get('[data-test="findings-notes-toggle"]');
    expect(toggle.attributes('aria-expanded')).toBe('false');
    expect(toggle.text()).toContain('Show 1 note');
    await toggle.trigger('click');
    expect(toggle.attributes('aria-expanded')).toBe('true');
    expect(toggle.text()).toContain('Hide 1 note');
    const items = wrapper.findAll('[data-severity]');
    expect(items.map((i) => i.attributes('data-severity'))).toEqual(['error', 'warning', 'info']);
    expect(items[0].text()).toContain('Remedy: Use 32-bit words');
    expect(items[0].text()).toContain('2.61 Hz');
    expect(items[0].text()).toContain('limit 50 mHz');
    // A fraction reads as percent, never as "0.048 fraction".
    expect(items[2].text()).toContain('4.8 %');
    expect(items[2].text()).toContain('limit 5 %');
    expect(wrapper.text()).not.toContain('fraction');
    expect(wrapper.text()).toContain('1 error');
    expect(wrapper.text()).toContain('1 warning');
  });

  it('says so when only info notes are left, and still folds them', () => {
    const checks = buildAnalysis().checks.filter((c) => c.severity === 'info');
    const wrapper = mount(AnalysisFindings, { props: { checks }, global });
    expect(wrapper.find('[data-test="findings-none-serious"]').exists()).toBe(true);
    expect(wrapper.findAll('[data-severity]')).toHaveLength(0);
    expect(wrapper.get('[data-test="findings-notes-toggle"]').text()).toContain(`Show ${checks.length} note`);
  });

  it('flags the unstable loop and says when a margin does not exist', () => {
    const wrapper = mount(AnalysisLoopTable, { props: { loops: buildAnalysis().loops }, global });
    const rows = wrapper.findAll('tbody tr');
    expect(rows[0].text()).toContain('985.1 Hz');
    expect(rows[0].text()).toContain('52.3°');
    expect(rows[0].text()).toContain('stable');
    expect(rows[1].text()).toContain('UNSTABLE');
    expect(rows[1].text()).toContain('none');
    expect(rows[1].find('[aria-label="no phase crossing below Nyquist"]').exists()).toBe(true);
    expect(rows[1].find('.vs-cell-error').exists()).toBe(true);
  });

  it('shows where each resonance lands per method and highlights the drifting one', () => {
    const wrapper = mount(AnalysisResonanceTable, { props: { result: buildAnalysis() }, global });
    const head = wrapper.find('thead').text();
    for (const m of ['Tustin', 'Tustin, prewarped', 'Zero-order hold']) expect(head).toContain(m);
    // The product's own names, not option keywords.
    for (const keyword of ['tustin', 'prewarp ', 'zoh']) expect(head).not.toContain(keyword);
    const rows = wrapper.findAll('tbody tr');
    expect(rows).toHaveLength(2);
    expect(rows[0].text()).toContain('52.61');
    expect(rows[0].text()).toContain('+2.61 Hz');
    expect(rows[0].text()).toContain('49.9959');
    expect(rows[0].find('.vs-cell-error').exists()).toBe(true);
    expect(rows[1].find('.vs-cell-error').exists()).toBe(false);
  });

  it('highlights fixed-point rows by their checks and shows format, integers, drift, headroom', () => {
    const wrapper = mount(AnalysisWordTable, { props: { result: buildAnalysis() }, global });
    const rows = wrapper.findAll('tbody tr');
    expect(rows.map((r) => r.attributes('data-severity'))).toEqual(['ok', 'error', 'warning']);
    expect(rows[1].text()).toContain('Q2.14');
    expect(rows[1].text()).toContain('16384, -32761, 16381');
    expect(rows[1].text()).toContain('+2.61 Hz');
    expect(rows[1].text()).toContain('4 bits');
    expect(rows[1].text()).toContain('Resonance h1 moves 2.61 Hz');
    expect(rows[2].text()).toContain('Lost below one LSB: b1');
    expect(rows[1].classes()).toContain('vs-cell-error');
  });

  it('gives the designed gains for the form placeholders', () => {
    expect(designedGainTexts(buildAnalysis())).toEqual({ 'currentLoop.kp': '3.77', 'currentLoop.resonantGains.0': '150', 'currentLoop.resonantGains.1': '40' });
  });
});
