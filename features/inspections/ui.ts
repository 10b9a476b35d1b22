/** What other features may render from the inspector's field screens (needs the app's runtime). */
export { InspectRideCard } from '@/features/inspections/inspect-ride-card';
export { ChecklistSection } from '@/features/inspections/checklist-section';
export { useDraftEditor, useDraftQuery, useFieldRideQuery } from '@/features/inspections/field-api';
