import { View } from 'react-native';

import { Text } from '@/components/text';
import { space } from '@/components/theme';

/** How to fix the phone, in the words the inspector needs at the ride. */
export function MountingWords({ inSeat }: { inSeat: boolean }) {
  return inSeat ? (
    <View style={{ gap: space.xs }} accessibilityLabel="How to hold the phone in a seat">
      <Text variant="label">How to hold the phone in the seat</Text>
      <Text variant="small">
        Press the phone flat against the side of the seat, or against the rider’s right side, with the screen
        facing out to the rider’s right and its top edge toward the rider’s head. Hold it firmly so it moves
        with the seat and cannot turn in the hand. The screen then lies parallel to the plane the ride moves
        in.
      </Text>
    </View>
  ) : (
    <View style={{ gap: space.xs }} accessibilityLabel="How to fix the phone">
      <Text variant="label">How to fix the phone</Text>
      <Text variant="small">
        Clamp or strap the phone rigidly to the arm or gondola of the pivot you chose — not held in a hand,
        not loose in a pocket. Lay its screen against a face parallel to the plane the arm moves in, with the
        screen facing the side the ride’s design drawing is seen from. Which edge points up does not matter.
      </Text>
    </View>
  );
}

/** What a phone's record can and cannot say, plainly. */
export function RecordLimitsWords() {
  return (
    <View style={{ gap: space.xs }} accessibilityLabel="What the record can and cannot tell">
      <Text variant="label">What the record can and cannot tell</Text>
      <Text variant="small">
        It tells how fast the body turns through each cycle and, in a seat, the accelerations a rider feels,
        so the load check runs the ride’s real motion rather than the design’s.
      </Text>
      <Text variant="small">
        It cannot replace a calibrated instrument: a phone’s sensors are not calibrated, and typical phones
        stop reading at about ±2000 °/s and ±16 g (typical values, from memory — your phone may differ). A
        gyroscope gives no absolute angle, so a swing is taken as centred where the design centres it. Its
        small zero error (bias) drifts with temperature: it is removed over whole swings, but cannot be told
        apart from a steady speed. On a pivot above the first, the phone also feels everything below it.
      </Text>
    </View>
  );
}
