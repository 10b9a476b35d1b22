import { useLocalSearchParams } from 'expo-router';

import { InspectionScreen } from '@/features/inspections/inspection-screen';

export default function InspectRoute() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <InspectionScreen key={id} id={id} />;
}
