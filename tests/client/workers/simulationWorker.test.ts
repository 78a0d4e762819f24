// The simulation worker: analyses the design, runs the scenario with the real core, reports progress
// in steps of about 2 % and then the result; a failure comes back as a message, not a throw.
import { describe, expect, it, vi } from 'vitest';
import type { SimulationReply } from '../../../src/workers/simulationProtocol';
import { defaultSimulationOptions } from '../../../shared/simulation';
import { sc3Design } from '../simulationFixture';

async function loadWorker(replies: SimulationReply[]): Promise<(data: unknown) => void> {
  vi.resetModules();
  (self as unknown as { postMessage: (m: SimulationReply) => void }).postMessage = (m) => { replies.push(m); };
  await import('../../../src/workers/simulation.worker');
  const handler = (self as unknown as { onmessage: (e: { data: unknown }) => void }).onmessage;
  return (data) => handler({ data });
}

describe('simulation worker', () => {
  it('reports progress, then the result', async () => {
    const replies: SimulationReply[] = [];
    const post = await loadWorker(replies);
    post({ id: 3, design: sc3Design(), options: { ...defaultSimulationOptions('steady'), durationS: 10 / 60, tracePoints: 20 } });
    const progress = replies.filter((r) => r.kind === 'progress').map((r) => (r as { fraction: number }).fraction);
    expect(progress.length).toBeGreaterThan(2);
    expect(progress[progress.length - 1]).toBe(1);
    progress.slice(1).forEach((f, i) => expect(f).toBeGreaterThan(progress[i]));
    const last = replies[replies.length - 1];
    expect(last.kind).toBe('done');
    expect(last.id).toBe(3);
    if (last.kind === 'done') expect(last.result.format).toBe('varsmith-simulation/1');
  });

  it('answers a refused option with its rule', async () => {
    const replies: SimulationReply[] = [];
    const post = await loadWorker(replies);
    post({ id: 4, design: sc3Design(), options: { ...defaultSimulationOptions('steady'), durationS: 0.001 } });
    expect(replies).toEqual([{ id: 4, kind: 'failed', message: expect.stringMatching(/^durationS must be/), elapsedMs: expect.any(Number) }]);
  });
});
