/**
 * The one `import()` of the record chain's code on the web (features/ledger: canonical JSON, SHA-256 and
 * Ed25519 through @noble/curves): only submitting a record signs, so the code loads then, as a chunk of
 * its own, and stays out of the shared chunk every signed-in page loads (and out of Today's first visit).
 */
export type LedgerModule = typeof import('@/features/ledger');

export const loadLedger = (): Promise<LedgerModule> => import('@/features/ledger');
