// Factories for test data (the design values are the example of CONTRACT section 1).
import type { DesignInput } from '../../shared/control';
import { contractExampleDesign } from '../../shared/api/designExample';

/**
 * A valid L-filter design.
 * @param overrides - top-level fields to replace.
 * @returns the design.
 */
export function buildDesign(overrides: Partial<DesignInput> = {}): DesignInput {
  return { ...contractExampleDesign('SC-3 bench unit'), ...overrides } as DesignInput;
}
