// Payload of `POST /api/analyze` (CONTRACT section 6).
import { z } from 'zod';

/** Body of `POST /api/analyze`; the design is checked by parseDesign. */
export const analyzeRequestSchema = z.object({ design: z.record(z.string(), z.unknown()) });

/** Query of `POST /api/analyze`: `plots=1` adds sweep and step data. */
export const analyzeQuerySchema = z.object({ plots: z.enum(['0', '1']).default('0') });
/** An analyze query. */
export type AnalyzeQuery = z.infer<typeof analyzeQuerySchema>;
