/**
 * Registry cards only the ride's own pages show (the ride page, its parts and documents). They are public
 * like ui.ts, but kept out of it: ui.ts is imported by every area of the app, so whatever it exports rides
 * in the shared chunk that the inspector's first visit loads (README, "The web app's speed budget").
 */
export { RideDocumentsCard } from '@/features/registry/design-documents-card';
export { RideSetupsCard } from '@/features/registry/ride-setups-card';
