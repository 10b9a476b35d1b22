/** What other features may render or hook into from incidents (needs the app's runtime). */
export { incidentKeys, useRideIncidents } from '@/features/incidents/api';
export { IncidentFlags, IncidentRow } from '@/features/incidents/incident-row';
export { IncidentScreen } from '@/features/incidents/incident-screen';
export { IncidentReportScreen } from '@/features/incidents/report-screen';
export { RideIncidentsScreen } from '@/features/incidents/ride-incidents-screen';
