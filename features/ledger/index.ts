export * from './chain';
export * from './schema';
