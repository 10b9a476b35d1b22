/**
 * A notice whose results sit at and just past their limits (tests/support/limit-values.ts),
 * formatted by the notice issuer's own `resultsOf` from the engine's envelope and the record's typed texts.
 */
import type { UnitSystem } from '@/lib/units';
import { measuredSources } from '@/features/loads/format';
import type { NoticeDocument } from '@/features/notices/schema';
import { resultsOf } from '@/server/notices/document-parts';
import { limitEnvelope, limitReadings } from '@/tests/support/limit-values';
import { fixtureNotice } from '@/scripts/sample-notice';

export function limitResults(system: UnitSystem = 'si'): NoticeDocument['results'] {
  return resultsOf(limitEnvelope, measuredSources({ readings: limitReadings }), system);
}

export function limitNotice(): NoticeDocument {
  return { ...fixtureNotice, reference: 'PW-2026-0139', results: limitResults() };
}
