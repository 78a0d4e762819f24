// The design bench against an HTTP-mocked API: engineering units in the form become SI in the
// draft, unreadable text and schema violations show at the field, save conflicts open the
// conflict dialog, submit asks for a summary, the safety caution is in the footer.
import { describe, expect, it } from 'vitest';
import { http, HttpResponse } from 'msw';
import { server } from '../setup';
import { mountApp, settle, waitFor } from '../mountApp';
import { signInAs } from '../session';
import { buildDesignDetail } from '../fixtures';
import { useDesignStore } from '../../../src/stores/design';
import { expectClose } from '../../helpers/expectClose';
import { buildAnalysis } from '../analysisFixture';
import type { AnalysisRunner } from '../../../src/composables/useLiveAnalysis';

// Form behaviour is checked with a quick canned analysis; one test below runs the real core.
const cannedRunner: AnalysisRunner = async (request) => ({ id: request.id, ok: true, result: buildAnalysis(), elapsedMs: 0 });

function field(path: string): HTMLInputElement {
  const input = document.querySelector<HTMLInputElement>(`[data-path="${path}"] input, input[data-path="${path}"]`);
  if (!input) throw new Error(`no field ${path}`);
  return input;
}

async function typeInto(path: string, value: string): Promise<void> {
  const input = field(path);
  input.value = value;
  input.dispatchEvent(new Event('input'));
  await settle(2);
}

function fieldError(path: string): string {
  const wrapper = field(path).closest('.q-field');
  return wrapper?.querySelector('.q-field__messages')?.textContent?.trim() ?? '';
}

async function openBench(detail = buildDesignDetail()) {
  signInAs('engineer');
  server.use(http.get('*/api/designs/7', () => HttpResponse.json(detail)));
  const mounted = await mountApp('/designs/7', { analysisRunner: cannedRunner });
  await waitFor(() => document.querySelector('[data-path="filter.inductanceH"]') !== null);
  return mounted;
}

// Mounting the whole bench in happy-dom takes about a second per test.
describe('DesignWorkspacePage', { timeout: 30000 }, () => {
  it('shows the working copy in engineering units', async () => {
    await openBench();
    expect(field('filter.inductanceH').value).toBe('0.6');
    expect(field('dcLink.capacitanceF').value).toBe('2200');
    expect(field('sampling.switchingFrequencyHz').value).toBe('20');
    expect(field('filter.resistanceOhm').value).toBe('30');
    const text = document.body.textContent ?? '';
    for (const unit of ['mH', 'µF', 'kHz', 'mΩ', 'kVA', 'ms']) expect(text).toContain(unit);
  });

  it('stores what is typed in SI, whatever unit it is typed in', async () => {
    const { pinia } = await openBench();
    const store = useDesignStore(pinia);
    await typeInto('filter.inductanceH', '450 µH');
    await typeInto('sampling.switchingFrequencyHz', '16');
    await typeInto('dcLink.capacitanceF', '3.3 mF');
    await waitFor(() => store.draft?.sampling.switchingFrequencyHz === 16000);
    const filter = store.draft!.filter;
    expectClose(filter.topology === 'L' ? filter.inductanceH : NaN, 4.5e-4, { rtol: 1e-12 });
    expectClose(store.draft!.dcLink.capacitanceF, 3.3e-3, { rtol: 1e-12 });
    expect(store.dirty).toBe(true);
    expect(document.querySelector('[data-test="save-state"]')?.textContent).toContain('Unsaved changes');
  });

  it('shows unreadable text at its field and pauses the analysis', async () => {
    const { pinia } = await openBench();
    const store = useDesignStore(pinia);
    await typeInto('filter.inductanceH', 'six');
    await waitFor(() => fieldError('filter.inductanceH').includes('not a number'));
    expect(store.draftInvalid).toBe(true);
    expect(document.querySelector('[data-test="analysis-paused"]')).not.toBeNull();
    await typeInto('filter.inductanceH', '0.5');
    await waitFor(() => !store.draftInvalid);
    expect(fieldError('filter.inductanceH')).not.toContain('not a number');
  });

  it('shows the shared schema rule at the field it names', async () => {
    const { pinia } = await openBench();
    const store = useDesignStore(pinia);
    await typeInto('filter.inductanceH', '-0.6');
    await waitFor(() => store.draftInvalid && fieldError('filter.inductanceH') !== '');
    // The schema's SI range (1e-7, 1] H, said in the field's own unit.
    expect(fieldError('filter.inductanceH')).toBe('must be above 0.0001 mH and at most 1000 mH');
    await typeInto('filter.inductanceH', '0.6');
    await typeInto('sampling.switchingFrequencyHz', '0.2');
    await waitFor(() => store.draftInvalid);
    const anyFieldError = [...document.querySelectorAll('.q-field--error')].length;
    expect(anyFieldError).toBeGreaterThan(0);
  });

  it('saves with Ctrl+S semantics through the Save button and keeps the new version as the base', async () => {
    let baseVersion: number | null = null;
    const { pinia } = await openBench();
    server.use(http.put('*/api/designs/7', async ({ request }) => {
      const body = (await request.json()) as { design: unknown; baseVersion: number };
      baseVersion = body.baseVersion;
      return HttpResponse.json(buildDesignDetail({ version: 4, design: body.design as never }));
    }));
    await typeInto('grid.voltageRmsV', '127');
    await waitFor(() => useDesignStore(pinia).dirty);
    (document.querySelector('[data-test="save"]') as HTMLElement).click();
    await waitFor(() => useDesignStore(pinia).saved?.version === 4);
    expect(document.querySelector('[data-test="save-state"]')?.textContent).toBe('Saved');
    expect(baseVersion).toBe(3);
  });

  it('opens the conflict dialog on 409 and reloads their version', async () => {
    const theirs = buildDesignDetail({ version: 9, owner: { id: 5, name: 'Kit Firmware', email: 'kit@varsmith.test' } });
    theirs.design = { ...theirs.design, grid: { voltageRmsV: 127, frequencyHz: 60 } };
    let gets = 0;
    signInAs('engineer');
    server.use(
      http.get('*/api/designs/7', () => { gets += 1; return HttpResponse.json(gets === 1 ? buildDesignDetail() : theirs); }),
      http.put('*/api/designs/7', () => HttpResponse.json({ error: { code: 'stale-version', message: 'Someone saved in between' } }, { status: 409 })),
    );
    await mountApp('/designs/7', { analysisRunner: cannedRunner });
    await waitFor(() => document.querySelector('[data-path="filter.inductanceH"]') !== null);
    await typeInto('filter.inductanceH', '0.7');
    (document.querySelector('[data-test="save"]') as HTMLElement).click();
    await waitFor(() => document.querySelector('[data-test="conflict-dialog"]') !== null);
    const dialog = document.querySelector('[data-test="conflict-dialog"]')!.textContent ?? '';
    expect(dialog).toContain('grid.voltageRmsV');
    expect(dialog).toContain('filter.inductanceH');
    expect(dialog).toContain('Kit Firmware');
    (document.querySelector('[data-test="conflict-reload"]') as HTMLElement).click();
    await waitFor(() => field('grid.voltageRmsV').value === '127');
    expect(field('filter.inductanceH').value).toBe('0.6');
  });

  it('asks for a summary and submits for review', async () => {
    let summary: string | null = null;
    await openBench();
    server.use(http.post('*/api/designs/7/revisions', async ({ request }) => {
      summary = ((await request.json()) as { summary: string }).summary;
      return HttpResponse.json({ id: 30, number: 1, status: 'in-review' }, { status: 201 });
    }));
    (document.querySelector('[data-test="open-submit"]') as HTMLElement).click();
    await waitFor(() => document.querySelector('[data-test="submit-summary"]') !== null);
    const form = document.querySelector('[data-test="submit-confirm"]')!.closest('form')!;
    form.dispatchEvent(new Event('submit'));
    await waitFor(() => (document.body.textContent ?? '').includes('Tell the reviewer what changed.'));
    expect(summary).toBeNull();
    const box = document.querySelector<HTMLTextAreaElement>('[data-test="submit-summary"] textarea, textarea[data-test="submit-summary"]')!;
    box.value = 'First set for the bay 4 choke';
    box.dispatchEvent(new Event('input'));
    await settle();
    form.dispatchEvent(new Event('submit'));
    await waitFor(() => summary !== null);
    expect(summary).toBe('First set for the bay 4 choke');
  });

  it('carries the safety caution in the footer', async () => {
    await openBench();
    const note = document.querySelector('[aria-label="Safety caution"]')?.textContent ?? '';
    expect(note).toContain('current-limited bench');
    expect(note).toContain('IEEE 1547');
  });

  it('says when the design does not exist', async () => {
    signInAs('engineer');
    server.use(http.get('*/api/designs/404', () => HttpResponse.json({ error: { code: 'not-found', message: 'No design 404' } }, { status: 404 })));
    await mountApp('/designs/404', { analysisRunner: cannedRunner });
    await waitFor(() => (document.body.textContent ?? '').includes('This design does not exist.'));
  });

  it('runs the real core live and shows the designed kp greyed in the blank override', async () => {
    signInAs('engineer');
    server.use(http.get('*/api/designs/7', () => HttpResponse.json(buildDesignDetail())));
    await mountApp('/designs/7');
    await waitFor(() => document.querySelector('[data-test="findings"]') !== null, 60000);
    // CONTRACT section 2 rule: kp = 2*pi*crossoverHz*L = 2*pi*1000*0.6e-3 = 3.769911... V/A.
    const placeholder = field('currentLoop.kp').getAttribute('placeholder') ?? '';
    // Shown to four significant digits (3.77), so it fits in the field.
    expectClose(Number.parseFloat(placeholder), 2 * Math.PI * 1000 * 0.6e-3, { rtol: 1e-3 });
    const hint = field('currentLoop.kp').closest('.q-field')?.querySelector('.q-field__messages')?.textContent ?? '';
    expect(hint).toContain('designed by rule');
    expect(document.querySelector('[data-test="loop-table"]')?.textContent).toContain('Current loop (PR)');
  }, 90000);
});
