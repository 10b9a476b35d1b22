/** What other features may render from bulletins (needs the app's runtime). */
export { RideBulletinsCard } from '@/features/bulletins/ride-bulletins-card';
