/** What other features may render from records (needs the app's runtime). */
export { LoadCheckBasis } from '@/features/records/load-check-basis';
