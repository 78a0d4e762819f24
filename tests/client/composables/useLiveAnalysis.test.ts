// Live analysis: keystrokes within the debounce coalesce into one run, stale answers are
// dropped, an invalid form pauses without discarding the last result.
import { describe, expect, it } from 'vitest';
import { defineComponent, h, nextTick, ref } from 'vue';
import { mount } from '@vue/test-utils';
import type { AnalysisResult, DesignInput } from '../../../shared/control';
import { useLiveAnalysis, type AnalysisRunner, type LiveAnalysis } from '../../../src/composables/useLiveAnalysis';
import type { AnalysisReply, AnalysisRequest } from '../../../src/workers/analysisProtocol';
import { newDesignTemplate } from '../../../src/stores/designs';

function fakeResult(tag: string): AnalysisResult {
  return { format: 'varsmith-analysis/1', sampleTimeS: 5e-5, blocks: [], loops: [], plant: { tag }, checks: [] };
}

function harness(runner: AnalysisRunner, debounceMs: number) {
  const design = ref<DesignInput | null>(newDesignTemplate('a'));
  let live!: LiveAnalysis;
  const Comp = defineComponent({ setup() { live = useLiveAnalysis(design, { runner, debounceMs }); return () => h('div'); } });
  const wrapper = mount(Comp);
  return { design, live: () => live, wrapper };
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('useLiveAnalysis', () => {
  it('runs once for a burst of edits inside the debounce window, with the last design', async () => {
    const seen: AnalysisRequest[] = [];
    const runner: AnalysisRunner = async (request) => { seen.push(request); return { id: request.id, ok: true, result: fakeResult(request.design.name), elapsedMs: 1 }; };
    const { design, live } = harness(runner, 40);
    await sleep(60);
    expect(seen).toHaveLength(1);
    for (const name of ['b', 'bc', 'bcd']) {
      design.value = { ...design.value!, name };
      await nextTick();
      await sleep(5);
    }
    await sleep(80);
    expect(seen.map((r) => r.design.name)).toEqual(['a', 'bcd']);
    expect(live().result.value?.plant.tag).toBe('bcd');
    expect(live().current.value).toBe(true);
    expect(seen[1].options).toEqual({ sweepPoints: 400, responseSamples: 400 });
  });

  it('drops an answer that arrives after a newer request', async () => {
    const resolvers: ((reply: AnalysisReply) => void)[] = [];
    const requests: AnalysisRequest[] = [];
    const runner: AnalysisRunner = (request) => new Promise((resolve) => { requests.push(request); resolvers.push(resolve); });
    const { design, live } = harness(runner, 0);
    await sleep(10);
    design.value = { ...design.value!, name: 'newer' };
    await nextTick();
    await sleep(10);
    expect(requests).toHaveLength(2);
    resolvers[1]({ id: requests[1].id, ok: true, result: fakeResult('newer'), elapsedMs: 1 });
    await sleep(0);
    resolvers[0]({ id: requests[0].id, ok: true, result: fakeResult('older'), elapsedMs: 1 });
    await sleep(0);
    expect(live().result.value?.plant.tag).toBe('newer');
  });

  it('keeps the last result, marked not current, while the form is invalid; reports failures', async () => {
    const runner: AnalysisRunner = async (request) => (request.design.name === 'boom'
      ? { id: request.id, ok: false, message: 'singular matrix', elapsedMs: 1 }
      : { id: request.id, ok: true, result: fakeResult(request.design.name), elapsedMs: 1 });
    const { design, live } = harness(runner, 0);
    await sleep(10);
    design.value = null;
    await nextTick();
    expect(live().result.value?.plant.tag).toBe('a');
    expect(live().current.value).toBe(false);
    design.value = { ...newDesignTemplate('boom') };
    await nextTick();
    await sleep(10);
    expect(live().error.value).toBe('singular matrix');
  });
});
