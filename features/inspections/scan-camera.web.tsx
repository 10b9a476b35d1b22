import jsQR from 'jsqr';
import { useEffect, useRef } from 'react';
import { StyleSheet, View } from 'react-native';

import { colors, radius } from '@/components/theme';
import type { CameraTrouble, ScanCameraProps } from '@/features/inspections/scan-camera-types';

/** How often a frame is read for a code. */
const EVERY_MS = 150;
/** Frames are read at most this wide: enough for a plate at arm's length, cheap on a phone. */
const MAX_WIDTH = 640;

function troubleOf(err: unknown): CameraTrouble {
  const name = err instanceof Error || err instanceof DOMException ? err.name : '';
  if (name === 'NotAllowedError' || name === 'SecurityError') return 'refused';
  if (name === 'NotFoundError' || name === 'OverconstrainedError') return 'missing';
  return 'failed';
}

/**
 * The camera on the web: the back camera's stream in a <video>, a frame drawn to a canvas every 150 ms
 * and read by jsQR (the `jsqr` package; this module is loaded only with the scan screen). The stream's
 * tracks are stopped when the view goes (leaving the screen, or a code being handled).
 */
export function ScanCamera({ onCode, onTrouble }: ScanCameraProps) {
  const video = useRef<HTMLVideoElement>(null);
  const report = useRef({ onCode, onTrouble });
  useEffect(() => {
    report.current = { onCode, onTrouble };
  }, [onCode, onTrouble]);

  useEffect(() => {
    let stream: MediaStream | null = null;
    let timer: ReturnType<typeof setInterval> | null = null;
    let gone = false;
    const view = video.current;
    const canvas = document.createElement('canvas');
    const ctx = canvas.getContext('2d', { willReadFrequently: true });
    const readFrame = () => {
      const v = view;
      if (!v || !ctx || v.readyState < 2 || !v.videoWidth) return;
      const scale = Math.min(1, MAX_WIDTH / v.videoWidth);
      const w = Math.round(v.videoWidth * scale);
      const h = Math.round(v.videoHeight * scale);
      if (canvas.width !== w || canvas.height !== h) Object.assign(canvas, { width: w, height: h });
      ctx.drawImage(v, 0, 0, w, h);
      const code = jsQR(ctx.getImageData(0, 0, w, h).data, w, h, { inversionAttempts: 'dontInvert' });
      if (code?.data) report.current.onCode(code.data);
    };
    if (!navigator.mediaDevices?.getUserMedia) {
      report.current.onTrouble('missing');
      return;
    }
    navigator.mediaDevices
      .getUserMedia({ video: { facingMode: 'environment' }, audio: false })
      .then(async (s) => {
        stream = s;
        if (gone || !view) return s.getTracks().forEach((t) => t.stop());
        view.srcObject = s;
        await view.play().catch(() => undefined);
        timer = setInterval(readFrame, EVERY_MS);
      })
      .catch((err: unknown) => !gone && report.current.onTrouble(troubleOf(err)));
    return () => {
      gone = true;
      if (timer) clearInterval(timer);
      stream?.getTracks().forEach((t) => t.stop());
      if (view) view.srcObject = null;
    };
  }, []);

  return (
    <View style={styles.frame}>
      <video
        ref={video}
        muted
        playsInline
        aria-label="Camera view: hold a plate’s QR code inside the frame"
        style={{ width: '100%', height: '100%', objectFit: 'cover', display: 'block' }}
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
});
