import { useState } from 'react';
import { View } from 'react-native';

import { CheckField } from '@/components/check-field';
import { Text } from '@/components/text';
import { askDevicePlace, devicePlaceAvailable } from '@/features/photos/ui';
import { usePhotoPlaceAllowed } from '@/features/settings';

/**
 * The inspector's choice to keep where photos are taken (off until they turn it on; kept on this device).
 * Turning it on in a browser asks for location permission there and then, never before.
 */
export function PhotoPlaceToggle() {
  const [allowed, setAllowed] = usePhotoPlaceAllowed();
  const [note, setNote] = useState<string | null>(null);
  const change = async (on: boolean) => {
    setNote(null);
    if (!on) {
      setAllowed(false);
      return;
    }
    setAllowed(true);
    const answer = await askDevicePlace();
    if (answer === 'denied') {
      setAllowed(false);
      setNote('Location was not allowed on this device, so photos keep their time only.');
    }
  };
  return (
    <View>
      <CheckField label="Keep where photos are taken" value={allowed} onChange={(on) => void change(on)} />
      <Text variant="small" muted>
        {note ??
          (allowed
            ? devicePlaceAvailable
              ? "Each new photo keeps the camera's GPS position, else this device's location."
              : "Each new photo keeps the camera's GPS position when the photo has one."
            : 'Photos keep the time they were taken; no location is kept.')}
      </Text>
    </View>
  );
}
