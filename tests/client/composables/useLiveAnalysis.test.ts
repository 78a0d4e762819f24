// Live analysis: the first edit runs at once, edits made while a run is in flight coalesce into
// one follow-up run, stale answers are dropped, an invalid form pauses without discarding the last
// result, and the page is told to show "settling" only when the result lags for a while.
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

function harness(runner: AnalysisRunner, settlingMs = 30) {
  const design = ref<DesignInput | null>(newDesignTemplate('a'));
  let live!: LiveAnalysis;
  const Comp = defineComponent({ setup() { live = useLiveAnalysis(design, { runner, settlingMs }); return () => h('div'); } });
  const wrapper = mount(Comp);
  return { design, live: () => live, wrapper };
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('useLiveAnalysis', () => {
  it('starts at once, and coalesces a burst of edits made during a run into one run with the last design', async () => {
    const resolvers: ((reply: AnalysisReply) => void)[] = [];
    const seen: AnalysisRequest[] = [];
    const runner: AnalysisRunner = (request) => new Promise((resolve) => { seen.push(request); resolvers.push(resolve); });
    const answer = (i: number) => resolvers[i]({ id: seen[i].id, ok: true, result: fakeResult(seen[i].design.name), elapsedMs: 1 });
    const { design, live } = harness(runner);
    expect(seen).toHaveLength(1); // no timer before the first run
    for (const name of ['b', 'bc', 'bcd']) {
      design.value = { ...design.value!, name };
      await nextTick();
    }
    expect(seen).toHaveLength(1); // still in flight: the edits wait
    answer(0);
    await sleep(0);
    // the answer for 'a' is stale and dropped; one follow-up run with the newest design
    expect(seen.map((r) => r.design.name)).toEqual(['a', 'bcd']);
    expect(live().result.value).toBeNull();
    expect(live().running.value).toBe(true);
    answer(1);
    await sleep(0);
    expect(live().result.value?.plant.tag).toBe('bcd');
    expect(live().current.value).toBe(true);
    expect(live().running.value).toBe(false);
    expect(seen[1].options).toEqual({ sweepPoints: 400, responseSamples: 400 });
    design.value = { ...design.value!, name: 'e' };
    await nextTick();
    expect(seen.map((r) => r.design.name)).toEqual(['a', 'bcd', 'e']); // idle again: runs at once
  });

  it('says "settling" only when the shown result lags the form longer than the settling delay', async () => {
    const resolvers: ((reply: AnalysisReply) => void)[] = [];
    const seen: AnalysisRequest[] = [];
    const runner: AnalysisRunner = (request) => new Promise((resolve) => { seen.push(request); resolvers.push(resolve); });
    const answer = (i: number) => resolvers[i]({ id: seen[i].id, ok: true, result: fakeResult(seen[i].design.name), elapsedMs: 1 });
    const { design, live } = harness(runner, 30);
    answer(0);
    await sleep(0);
    design.value = { ...design.value!, name: 'quick' };
    await nextTick();
    expect(live().current.value).toBe(false);
    answer(1);
    await sleep(40);
    expect(live().settling.value).toBe(false); // answered inside the delay: never shown
    design.value = { ...design.value!, name: 'slow' };
    await nextTick();
    await sleep(10);
    expect(live().settling.value).toBe(false);
    await sleep(30);
    expect(live().settling.value).toBe(true);
    answer(2);
    await sleep(0);
    expect(live().settling.value).toBe(false);
    expect(live().result.value?.plant.tag).toBe('slow');
  });

  it('drops an answer that arrives after the form became invalid and valid again', async () => {
    const resolvers: ((reply: AnalysisReply) => void)[] = [];
    const requests: AnalysisRequest[] = [];
    const runner: AnalysisRunner = (request) => new Promise((resolve) => { requests.push(request); resolvers.push(resolve); });
    const { design, live } = harness(runner);
    design.value = null;
    await nextTick();
    design.value = { ...newDesignTemplate('newer') };
    await nextTick();
    resolvers[0]({ id: requests[0].id, ok: true, result: fakeResult('older'), elapsedMs: 1 });
    await sleep(0);
    expect(live().result.value).toBeNull();
    expect(requests.map((r) => r.design.name)).toEqual(['a', 'newer']);
    resolvers[1]({ id: requests[1].id, ok: true, result: fakeResult('newer'), elapsedMs: 1 });
    await sleep(0);
    expect(live().result.value?.plant.tag).toBe('newer');
  });

  it('keeps the last result, marked not current, while the form is invalid; reports failures', async () => {
    const runner: AnalysisRunner = async (request) => (request.design.name === 'boom'
      ? { id: request.id, ok: false, message: 'singular matrix', elapsedMs: 1 }
      : { id: request.id, ok: true, result: fakeResult(request.design.name), elapsedMs: 1 });
    const { design, live } = harness(runner);
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
