/** Notices to operators (the list and one notice), and operators' incident reports. */
export { IncidentScreen } from '@/features/incidents/incident-screen';
export { IncidentReportScreen } from '@/features/incidents/report-screen';
export { RideIncidentsScreen } from '@/features/incidents/ride-incidents-screen';
export { NoticeListScreen } from '@/features/notices/notice-list-screen';
export { NoticeScreen } from '@/features/notices/notice-screen';
