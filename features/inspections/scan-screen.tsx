import { Platform, StyleSheet, View } from 'react-native';
import { useCallback, useRef, useState } from 'react';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { API_BASE } from '@/features/api';
import { RoleGate } from '@/features/auth/ui';
import { todayHref } from '@/features/inspections/hrefs';
import { refusalMessage } from '@/features/inspections/plate-open';
import { PlateResult } from '@/features/inspections/plate-result';
import { ScanCamera } from '@/features/inspections/scan-camera';
import { type CameraTrouble, troubleMessage } from '@/features/inspections/scan-camera-types';
import { type PlateTarget, parsePlateCode } from '@/features/rides';
import { SubScreen } from '@/components/sub-screen';

/** The address plates of this server begin with: the page's own on the web, the server's on a phone. */
const appBase = () =>
  Platform.OS === 'web' && typeof window !== 'undefined' ? window.location.origin : API_BASE;

/** The same unreadable code seen frame after frame is answered once, until this long has passed. */
const REPEAT_MS = 3000;

/**
 * Scanning a plate on the ride: the camera reads QR codes; a plate of this server opens its ride or its
 * pivot's readings from what the phone holds (plate-result.tsx), with no signal needed. Any other code,
 * a refused or missing camera, gets a plain message; the plate's address can be pasted or typed instead.
 */
export function ScanScreen() {
  return <RoleGate roles={['inspector']}>{() => <Scanner />}</RoleGate>;
}

function Scanner() {
  const [target, setTarget] = useState<PlateTarget | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [trouble, setTrouble] = useState<CameraTrouble | null>(null);
  const [typed, setTyped] = useState('');
  const last = useRef<{ text: string; at: number } | null>(null);

  const handle = useCallback((text: string, fromCamera: boolean) => {
    const now = Date.now();
    if (fromCamera && last.current?.text === text && now - last.current.at < REPEAT_MS) return;
    last.current = { text, at: now };
    const parsed = parsePlateCode(text, appBase());
    if (!parsed.ok) {
      setMessage(refusalMessage[parsed.why]);
      return;
    }
    setMessage(null);
    setTarget(parsed.target);
  }, []);
  const onCode = useCallback((text: string) => handle(text, true), [handle]);
  const onTrouble = useCallback((t: CameraTrouble) => setTrouble(t), []);
  const onRefused = useCallback((m: string) => {
    setMessage(m);
    setTarget(null);
  }, []);

  return (
    <SubScreen
      title="Scan a plate"
      subtitle="Hold the QR plate on the ride or on a pivot inside the frame"
      back={{ href: todayHref, label: 'Today' }}
    >
      {target ? (
        <View style={styles.part}>
          <PlateResult target={target} onRefused={onRefused} />
          <Button label="Scan another plate" tone="quiet" onPress={() => setTarget(null)} />
        </View>
      ) : trouble ? (
        <Card>
          <Text role="alert" color={colors.danger}>
            {troubleMessage[trouble]}
          </Text>
        </Card>
      ) : (
        <ScanCamera onCode={onCode} onTrouble={onTrouble} />
      )}
      {message ? (
        <Card>
          <Text role="alert" color={colors.danger}>
            {message}
          </Text>
        </Card>
      ) : null}
      {target ? null : (
        <Card>
          <TextField
            label="Plate address"
            hint="No camera at hand? Paste or type the address the plate’s code holds."
            value={typed}
            onChangeText={setTyped}
            autoCapitalize="none"
            autoCorrect={false}
            inputMode="url"
            onSubmitEditing={() => handle(typed, false)}
          />
          <Button label="Open plate" tone="quiet" onPress={() => handle(typed, false)} />
        </Card>
      )}
    </SubScreen>
  );
}

const styles = StyleSheet.create({
  part: { gap: space.md },
});
