// Planted for tests/lint/layers.test.ts: the other half of the cycle.
import { a } from './a';

export const b = (): number => (Math.random() > 2 ? a() : 0);
