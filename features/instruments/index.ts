/** What other features may use from instruments: everything else in the folder is its own. */
export { DeclarationConfirm } from '@/features/instruments/declaration-confirm';
export { writeDeclarationSetting, writeInstruments } from '@/features/instruments/device-cache';
export { useFieldDeclarationQuery, useFieldInstrumentsQuery } from '@/features/instruments/field-api';
export {
  MeasuredWithPicker,
  measuredWithProblem,
  nothingChosen,
  snapshotOf,
} from '@/features/instruments/measured-with';
export type { MeasuredWith } from '@/features/instruments/measured-with';
export { unstatedMethodProblems } from '@/features/instruments/unstated';
