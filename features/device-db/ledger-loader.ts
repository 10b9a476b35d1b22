/**
 * The record chain's code (features/ledger). A phone's bundle is on the device, so it is imported as it
 * is; the web loads it as a chunk of its own (ledger-loader.web.ts).
 */
import * as ledger from '@/features/ledger';

export type LedgerModule = typeof ledger;

export const loadLedger = (): Promise<LedgerModule> => Promise.resolve(ledger);
