/**
 * What other features may render or hook into from incidents (needs the app's runtime). The screens are
 * not here: the notices bundle (features/shell/bundles/notices.ts) imports them by path, so a ride page
 * that shows a ride's reports does not carry the report form with it.
 */
export { incidentKeys, useRideIncidents } from '@/features/incidents/api';
export { IncidentFlags, IncidentRow } from '@/features/incidents/incident-row';
