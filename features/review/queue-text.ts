/** The queue's words and links, shared by the desktop table and the phone cards. */
import { inspectionTypeLabel } from '@/features/registry/schema';
import { formatDate } from '@/lib/dates';
import { type QueueItem, urgencyInfo } from '@/features/review/schema';
import { reviewHref } from '@/features/review/hrefs';
import { rideHref } from '@/features/rides';
import { incidentHref, incidentKindVocabulary } from '@/features/incidents';

/**
 * An inspection opens on the review desk; an incident report opens the report; a ride in the queue for its
 * dates opens the ride's page.
 */
export function queueItemHref(item: QueueItem) {
  if (item.incidentId) return incidentHref(item.incidentId);
  // A ride flagged by a returned inspection opens that inspection.
  return item.inspectionId ? reviewHref(item.inspectionId) : rideHref(item.rideId);
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * What the ride's pivot life flags: an NDT past its due date, and a pin or bushing that may reach its wear
 * limit before the next scheduled inspection, with the earlier date suggested for an inspection.
 */
export function queueItemLifeFacts(item: QueueItem): string[] {
  const facts: string[] = [];
  if (item.ndtDueOn) facts.push(`NDT overdue since ${formatDate(item.ndtDueOn)}`);
  if (item.wearSuggestedOn)
    facts.push(
      `Wear may reach its limit${item.wearLimitOn ? ` by ${formatDate(item.wearLimitOn)}` : ''}, before the ` +
        `next inspection: inspect by ${formatDate(item.wearSuggestedOn)}`,
    );
  return facts;
}

/** What the item is: the inspection and who did it, or what is late on the ride. */
export function queueItemWhat(item: QueueItem): string {
  if (item.kind === 'incident') {
    const kind = item.incidentKind ? incidentKindVocabulary[item.incidentKind].label : 'Incident';
    return `${kind} reported by the operator${item.urgency === 'incident_serious' ? ': ride stopped or someone hurt' : ''}`;
  }
  if (item.kind === 'inspection' && item.inspectionType) {
    const type = inspectionTypeLabel[item.inspectionType];
    const what = item.inspectorName ? `${type} inspection by ${item.inspectorName}` : `${type} inspection`;
    return [what, ...queueItemLifeFacts(item)].join(' · ');
  }
  const parts: string[] = [];
  // A returned inspection that was over a limit or failed items: the ride stays flagged until resolved.
  if (item.inspectionType && (item.urgency === 'over' || item.urgency === 'failed'))
    parts.push(
      `${inspectionTypeLabel[item.inspectionType]} inspection returned ${
        item.urgency === 'over' ? 'over limit' : 'with failed items'
      }, not yet resolved`,
    );
  if (item.dailyFailedAt)
    parts.push(
      `Daily check failed ${formatDate(item.dailyFailedAt)}: the ride must not open until one passes`,
    );
  if (item.dailyMissedOn) parts.push(`Ran without a daily check on ${formatDate(item.dailyMissedOn)}`);
  if (item.overdueSince) parts.push(`Inspection overdue since ${formatDate(item.overdueSince)}`);
  if (item.findingsPastDue > 0) parts.push(`${plural(item.findingsPastDue, 'finding', 'findings')} past due`);
  parts.push(...queueItemLifeFacts(item));
  return parts.join(' · ') || urgencyInfo[item.urgency].description;
}

/** A row's name for screen readers and the link: why, which ride, what. */
export function queueItemLabel(item: QueueItem): string {
  return `${urgencyInfo[item.urgency].label}: ${item.rideName}, ${queueItemWhat(item)}`;
}
