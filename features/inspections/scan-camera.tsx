import { CameraView, useCameraPermissions } from 'expo-camera';
import { useEffect, useRef } from 'react';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { colors, radius } from '@/components/theme';
import type { ScanCameraProps } from '@/features/inspections/scan-camera-types';

/**
 * The camera on a phone's own app: expo-camera's view reading QR codes (asked for once; a refusal is
 * reported so the screen can say so). The web has its own (scan-camera.web.tsx), so expo-camera never
 * reaches the web bundle.
 */
export function ScanCamera({ onCode, onTrouble }: ScanCameraProps) {
  const [permission, ask] = useCameraPermissions();
  const asked = useRef(false);
  useEffect(() => {
    if (!permission || permission.granted) return;
    if (permission.canAskAgain && !asked.current) {
      asked.current = true;
      void ask();
    } else onTrouble('refused');
  }, [permission, ask, onTrouble]);
  if (!permission?.granted)
    return (
      <View style={[styles.frame, styles.waiting]}>
        <Spinner color={colors.surface} />
      </View>
    );
  return (
    <View style={styles.frame}>
      <CameraView
        style={StyleSheet.absoluteFill}
        facing="back"
        barcodeScannerSettings={{ barcodeTypes: ['qr'] }}
        onBarcodeScanned={(r) => onCode(r.data)}
        onMountError={() => onTrouble('failed')}
        accessibilityLabel="Camera view: hold a plate’s QR code inside the frame"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  frame: {
    width: '100%',
    maxWidth: 480,
    aspectRatio: 1,
    alignSelf: 'center',
    overflow: 'hidden',
    borderRadius: radius.lg,
    borderWidth: 3,
    borderColor: colors.base,
    backgroundColor: '#000',
  },
  waiting: { alignItems: 'center', justifyContent: 'center' },
});
