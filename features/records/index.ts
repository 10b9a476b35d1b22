/** What other features and the server may use from records: runs anywhere (no React Native). */
export { analyseRecord, previewOf } from '@/features/records/analysis';
export { answerOfReading, enterChecklistValue, sharedReadingTitle } from '@/features/records/checklist-entry';
export type { ReadingTarget } from '@/features/records/checklist-entry';
export {
  checklistValueStatus,
  disagreeingReadings,
  envelopeItemOf,
  isGap,
  readingLink,
  resolveLimit,
} from '@/features/records/checklist-limits';
export {
  addPhoto,
  addReading,
  answerItem,
  draftProblems,
  draftProgress,
  newCorrection,
  newDraft,
  putMotionRecord,
  removeMotionRecord,
  removePhoto,
  removeReading,
  setNotes,
  toRecord,
  updatePhoto,
} from '@/features/records/draft';
export type { Draft } from '@/features/records/draft';
export {
  PLAUSIBLE_HIGH,
  PLAUSIBLE_LOW,
  checkReading,
  plausibilityText,
} from '@/features/records/plausibility';
export type { PlausibilityCheck } from '@/features/records/plausibility';
export { measuredRiderOf, motionProfileOf, motionRecordWarnings } from '@/features/records/motion-record';
export type { MeasuredRider } from '@/features/records/motion-record';
