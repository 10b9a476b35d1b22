/** What other features may use from parts that needs the app's runtime. */
export { partKeys, useRidePartsQuery } from '@/features/parts/api';
export { PartsScreen } from '@/features/parts/parts-screen';
