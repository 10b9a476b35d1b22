/** Notices to operators (the list and one notice), and operators' incident reports. */
export { IncidentReportScreen, IncidentScreen, RideIncidentsScreen } from '@/features/incidents/ui';
export { NoticeListScreen } from '@/features/notices/notice-list-screen';
export { NoticeScreen } from '@/features/notices/notice-screen';
