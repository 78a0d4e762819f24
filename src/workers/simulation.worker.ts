// Runs whole-system simulations off the main thread: analyse the design, run the scenario, report
// progress about every 2 %. Cancelling terminates this worker (the page starts a new one).
import { analyzeDesign } from '../../shared/control';
import { simulateScenario } from '../../shared/simulation';
import type { SimulationReply, SimulationRequest } from './simulationProtocol';

const post = (reply: SimulationReply): void => { (self as unknown as Worker).postMessage(reply); };

self.onmessage = (event: MessageEvent<SimulationRequest>) => {
  const { id, design, options } = event.data;
  const started = performance.now();
  let lastReported = -1;
  try {
    const analysis = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 });
    const result = simulateScenario(design, analysis, options, {
      progress: (fraction) => {
        if (fraction - lastReported < 0.02 && fraction < 1) return;
        lastReported = fraction;
        post({ id, kind: 'progress', fraction });
      },
    });
    post({ id, kind: 'done', result, elapsedMs: performance.now() - started });
  } catch (cause) {
    post({ id, kind: 'failed', message: cause instanceof Error ? cause.message : String(cause), elapsedMs: performance.now() - started });
  }
};
