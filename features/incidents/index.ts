/** What runs anywhere from incidents: the contract's words and links (no React Native). */
export { incidentHref } from '@/features/incidents/hrefs';
export {
  incidentKindVocabulary,
  incidentKinds,
  incidentSummary,
  isSeriousIncident,
  type Incident,
  type IncidentKind,
} from '@/features/incidents/schema';
