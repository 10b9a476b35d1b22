import { useLocalSearchParams } from 'expo-router';

import { InspectionScreen } from '@/features/inspections/inspection-screen';

/** The inspection named in the route; a new id remounts the screen, so no state of the last one remains. */
export function InspectRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <InspectionScreen key={id} id={id} />;
}
