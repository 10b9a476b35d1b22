import { useQuery } from '@tanstack/react-query';

import { fieldKeys } from '@/features/device-db';
import { useDeviceDb } from '@/features/device-db/ui';
import { readDeclarationSetting, readInstruments } from '@/features/instruments/device-cache';

/** Under `fieldKeys.all`, so a finished sync (which invalidates the field's keys) re-reads them. */
const fieldInstrumentKeys = {
  instruments: () => [...fieldKeys.all, 'instruments'] as const,
  declaration: () => [...fieldKeys.all, 'declaration'] as const,
};

/** The instrument register as the phone last pulled it. */
export function useFieldInstrumentsQuery() {
  const dev = useDeviceDb();
  return useQuery({
    queryKey: fieldInstrumentKeys.instruments(),
    staleTime: 0,
    queryFn: () => readInstruments(dev),
  });
}

/** The declaration text as the phone last pulled it; null before the first such pull. */
export function useFieldDeclarationQuery() {
  const dev = useDeviceDb();
  return useQuery({
    queryKey: fieldInstrumentKeys.declaration(),
    staleTime: 0,
    queryFn: () => readDeclarationSetting(dev),
  });
}
