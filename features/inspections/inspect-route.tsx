import { useLocalSearchParams } from 'expo-router';

import { pivotOfParam } from '@/features/inspections/hrefs';
import { InspectionScreen } from '@/features/inspections/inspection-screen';

/**
 * The inspection named in the route; a new id remounts the screen, so no state of the last one remains.
 * `?step=readings&pivot=n` (a scanned plate) opens it at the readings, with pivot n's card in view.
 */
export function InspectRoute() {
  const { id, step, pivot } = useLocalSearchParams<{ id: string; step?: string; pivot?: string }>();
  const joint = pivotOfParam(pivot);
  return (
    <InspectionScreen
      key={`${id}:${joint ?? ''}`}
      id={id}
      openAt={step === 'readings' || joint !== null ? { joint } : undefined}
    />
  );
}
