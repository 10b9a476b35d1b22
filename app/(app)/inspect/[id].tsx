export { InspectRoute as default } from '@/features/inspections/inspect-route';
