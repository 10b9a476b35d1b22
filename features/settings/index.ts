/** What other features may use from settings: everything else in the folder is its own. */
export { useUnitSystem } from '@/features/settings/unit-system';
