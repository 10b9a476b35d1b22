/**
 * The web's split points: one `import()` per bundle module, here and nowhere else. Metro makes a chunk of
 * each import target, and whatever two chunks share moves into the shared chunk (load-shared.web.ts), so
 * grouping screens by area keeps code that only one role uses in that role's chunk.
 */
export const frame = () => import('@/features/shell/bundles/frame');
export const inspector = () => import('@/features/shell/bundles/inspector');
export const review = () => import('@/features/shell/bundles/review');
export const rides = () => import('@/features/shell/bundles/rides');
export const notices = () => import('@/features/shell/bundles/notices');
export const operator = () => import('@/features/shell/bundles/operator');
export const admin = () => import('@/features/shell/bundles/admin');
export const calculator = () => import('@/features/shell/bundles/calculator');
export const account = () => import('@/features/shell/bundles/account');
export const scan = () => import('@/features/shell/bundles/scan');
