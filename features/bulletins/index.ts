/** Makers' bulletins: what runs anywhere (the phone's checklist items, matching, words). */
export {
  BULLETIN_AREA,
  bulletinApplies,
  bulletinChecklistItem,
  bulletinIdOfItem,
  bulletinItemId,
  matchKey,
  type OpenBulletin,
} from '@/features/bulletins/schema';
export { actionWords, deadlineWords } from '@/features/bulletins/words';
