import { Redirect, useLocalSearchParams } from 'expo-router';
import { useState } from 'react';

import { Card } from '@/components/card';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { todayHref } from '@/features/inspections/hrefs';
import { refusalMessage } from '@/features/inspections/plate-open';
import { PlateResult } from '@/features/inspections/plate-result';
import { type PlateTarget, parsePlatePath, platePath, rideHref } from '@/features/rides';

/**
 * A plate's address opened in the app (a phone's own camera app followed the code; a signed-out visitor
 * comes back here after signing in). An inspector gets what the Scan action gives, from the phone; anyone
 * else the ride's page.
 */
export function PlateScreen() {
  const params = useLocalSearchParams<{ ride: string; pivot?: string }>();
  // The same reading as a scanned code's: the path is rebuilt from the route's parts and parsed whole.
  const target = parsePlatePath(
    `${platePath({ rideId: String(params.ride ?? ''), joint: null })}${params.pivot ? `/${params.pivot}` : ''}`,
  );
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {(user) =>
        !target ? (
          <Refused message={refusalMessage['not-plate']} />
        ) : user.role === 'inspector' ? (
          <InspectorPlate target={target} />
        ) : (
          <Redirect href={rideHref(target.rideId)} />
        )
      }
    </RoleGate>
  );
}

function InspectorPlate({ target }: { target: PlateTarget }) {
  const [message, setMessage] = useState<string | null>(null);
  if (message) return <Refused message={message} />;
  return (
    <SubScreen title="Plate" back={{ href: todayHref, label: 'Today' }}>
      <PlateResult target={target} onRefused={setMessage} />
    </SubScreen>
  );
}

function Refused({ message }: { message: string }) {
  return (
    <SubScreen title="Plate" back={{ href: todayHref, label: 'Today' }}>
      <Card>
        <Text role="alert" color={colors.danger}>
          {message}
        </Text>
      </Card>
    </SubScreen>
  );
}
