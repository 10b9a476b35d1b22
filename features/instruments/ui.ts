/** What other features may render or hook into from instruments (needs the app's runtime). */
export { DeclarationConfirm } from '@/features/instruments/declaration-confirm';
export { useFieldDeclarationQuery, useFieldInstrumentsQuery } from '@/features/instruments/field-api';
export {
  MeasuredWithPicker,
  measuredWithProblem,
  nothingChosen,
  snapshotOf,
} from '@/features/instruments/measured-with';
export type { MeasuredWith } from '@/features/instruments/measured-with';
