/**
 * Every source of the ride logbook, one per kind of entry. To add one: write a `LogbookSource` (a kind, who
 * may see it, and a `read` that selects the ride's rows inside the query's range) and list it here; add
 * its kind to `logbookKinds` in features/logbook/schema.ts. The page, the CSV and the PDF take it from there.
 */
import { bulletinsSource } from '@/server/logbook/sources/bulletins';
import { dailyChecksSource } from '@/server/logbook/sources/daily-checks';
import { correctiveActionsSource, findingsSource } from '@/server/logbook/sources/findings';
import { decisionsSource, inspectionsSource } from '@/server/logbook/sources/inspections';
import { incidentsSource } from '@/server/logbook/sources/incidents';
import { noticesSource } from '@/server/logbook/sources/notices';
import { partsSource } from '@/server/logbook/sources/parts';
import {
  designDocumentsSource,
  designSource,
  ndtSource,
  statusSource,
} from '@/server/logbook/sources/register';
import { setupsSource } from '@/server/logbook/sources/setups';
import type { LogbookSource } from '@/server/logbook/source';

export const logbookSources: readonly LogbookSource[] = [
  inspectionsSource,
  decisionsSource,
  findingsSource,
  correctiveActionsSource,
  noticesSource,
  ndtSource,
  designSource,
  designDocumentsSource,
  statusSource,
  incidentsSource,
  partsSource,
  setupsSource,
  dailyChecksSource,
  bulletinsSource,
];
