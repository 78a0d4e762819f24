// Runs the shared core off the main thread so typing stays smooth while the analysis computes.
import { analyzeDesign } from '../../shared/control';
import type { AnalysisRequest, AnalysisReply } from './analysisProtocol';

self.onmessage = (event: MessageEvent<AnalysisRequest>) => {
  const { id, design, options } = event.data;
  const started = performance.now();
  let reply: AnalysisReply;
  try {
    const result = analyzeDesign(design, options);
    reply = { id, ok: true, result, elapsedMs: performance.now() - started };
  } catch (cause) {
    reply = { id, ok: false, message: cause instanceof Error ? cause.message : String(cause), elapsedMs: performance.now() - started };
  }
  (self as unknown as Worker).postMessage(reply);
};
