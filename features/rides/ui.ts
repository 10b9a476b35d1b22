/** What other features may render or hook into from rides (needs the app's runtime). */
export { RideCard } from '@/features/rides/ride-card';
export { RideClassFilter, RideStatusFilter } from '@/features/rides/ride-filters';
export { RideGrid } from '@/features/rides/ride-grid';
