// The analysis worker: answers every request with the real core, then warms the engine up with a
// bounded number of discarded re-runs while idle; a real request is answered before any of them,
// and a quick run ends the warm-up for good.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { AnalysisReply } from '../../../src/workers/analysisProtocol';
import { newDesignTemplate } from '../../../src/stores/designs';

const core = vi.hoisted(() => ({ runs: 0, costMs: 50, names: [] as string[] }));

// Only the clock of the core is faked, to make runs "slow" or "quick"; its answers are real.
vi.mock('../../../shared/control', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../../shared/control')>();
  return {
    ...real,
    analyzeDesign: (...args: Parameters<typeof real.analyzeDesign>) => {
      core.runs += 1;
      core.names.push(args[0].name);
      const result = real.analyzeDesign(...args);
      nowMs += core.costMs;
      return result;
    },
  };
});

let nowMs = 0;
const replies: AnalysisReply[] = [];

async function loadWorker(): Promise<(data: unknown) => void> {
  vi.resetModules();
  (self as unknown as { postMessage: (m: AnalysisReply) => void }).postMessage = (m) => { replies.push(m); };
  await import('../../../src/workers/analysis.worker');
  const handler = (self as unknown as { onmessage: (e: { data: unknown }) => void }).onmessage;
  return (data) => handler({ data });
}

const request = (id: number) => ({ id, design: newDesignTemplate(`w${id}`), options: { sweepPoints: 0, responseSamples: 0 } });

describe('analysis worker', () => {
  beforeEach(() => {
    vi.useFakeTimers();
    vi.spyOn(performance, 'now').mockImplementation(() => nowMs);
    core.runs = 0;
    core.names.length = 0;
    replies.length = 0;
  });
  afterEach(() => { vi.useRealTimers(); vi.restoreAllMocks(); });

  it('answers, then re-runs at most 8 times while idle and throws those results away', async () => {
    core.costMs = 50; // never "quick": the bound ends the warm-up
    const post = await loadWorker();
    post(request(1));
    expect(replies).toHaveLength(1);
    expect(replies[0]).toMatchObject({ id: 1, ok: true, elapsedMs: 50 });
    await vi.runAllTimersAsync();
    expect(core.runs).toBe(1 + 8);
    expect(replies).toHaveLength(1);
    post(request(2));
    await vi.runAllTimersAsync();
    expect(core.runs).toBe(1 + 8 + 1); // warmed up once per worker
    expect(replies.map((r) => r.id)).toEqual([1, 2]);
  });

  it('answers a real request at once during the warm-up, follows the newest request, and stops after a quick run', async () => {
    core.costMs = 50;
    const post = await loadWorker();
    post(request(1));
    vi.advanceTimersToNextTimer(); // one warm-up run done, the next is pending
    expect(core.runs).toBe(2);
    core.costMs = 3; // optimised now
    post(request(2)); // answered at once, before any pending warm-up run
    expect(core.runs).toBe(3);
    expect(replies.map((r) => r.id)).toEqual([1, 2]);
    await vi.runAllTimersAsync();
    expect(core.runs).toBe(4); // one more run, quick: the warm-up ends
    expect(core.names).toEqual(['w1', 'w1', 'w2', 'w2']); // warm-up follows the newest request only
  });

  it('reports a failure and does not warm up on it', async () => {
    const post = await loadWorker();
    post({ id: 7, design: { ...newDesignTemplate('bad'), sampling: null }, options: { sweepPoints: 0, responseSamples: 0 } });
    await vi.runAllTimersAsync();
    expect(replies[0]).toMatchObject({ id: 7, ok: false });
    expect(core.runs).toBe(1);
  });
});
