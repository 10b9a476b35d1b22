/**
 * Request and response shapes of the ride register API (operator companies, sites, rides, design data and
 * its versions, audit entries), shared by the server's validation and the app's forms and API client.
 * Pure zod: no React. Nullable text fields take a string or null; an empty string counts as null. In an
 * update (PATCH) a field left out stays as it is, and null clears it.
 */
export * from '@/features/registry/schema/companies';
export * from '@/features/registry/schema/sites';
export * from '@/features/registry/schema/rides';
export * from '@/features/registry/schema/design';
export * from '@/features/registry/schema/audit';
export * from '@/features/registry/schema/checklists';
export * from '@/features/registry/schema/schedules';
export * from '@/features/registry/schema/design-files';
export * from '@/features/registry/schema/design-documents';
export * from '@/features/registry/schema/setups';
