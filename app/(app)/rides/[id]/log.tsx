export { RunningLogScreen as default } from '@/features/pivot-life/running-log-screen';
