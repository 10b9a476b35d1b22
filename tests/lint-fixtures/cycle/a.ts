// Planted for tests/lint/layers.test.ts: a and b import each other, which import/no-cycle must refuse.
import { b } from './b';

export const a = (): number => b() + 1;
