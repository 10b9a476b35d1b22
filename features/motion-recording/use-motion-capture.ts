import { useCallback, useEffect, useRef, useState } from 'react';

import { askMotionPermission, startMotionCapture } from '@/features/motion-recording/capture';
import {
  appendSample,
  chooseAxis,
  emptyTrace,
  type SensorTrace,
} from '@/features/motion-recording/processing';

/** How often the screen is redrawn while recording; the readings themselves arrive much faster. */
const REDRAW_MS = 250;
/** The live trace shows the last few seconds. */
const LIVE_WINDOW_S = 8;

export type CaptureState = 'idle' | 'asking' | 'recording' | 'stopped';

/**
 * Records the phone's motion readings into a trace kept outside React state (a hundred readings a second
 * would re-render the screen a hundred times), and hands the screen a small live window a few times a
 * second.
 */
export function useMotionCapture() {
  const trace = useRef<SensorTrace>(emptyTrace());
  const stopRef = useRef<(() => void) | null>(null);
  const [state, setState] = useState<CaptureState>('idle');
  const [error, setError] = useState<string | null>(null);
  const [live, setLive] = useState<{ timeS: number[]; values: number[]; count: number; durationS: number }>({
    timeS: [],
    values: [],
    count: 0,
    durationS: 0,
  });

  const stopSensors = () => {
    stopRef.current?.();
    stopRef.current = null;
  };
  useEffect(() => stopSensors, []);

  useEffect(() => {
    if (state !== 'recording') return;
    const timer = setInterval(() => {
      const t = trace.current;
      const n = t.timeS.length;
      if (n === 0) return;
      const axis = chooseAxis(t);
      let from = n - 1;
      while (from > 0 && t.timeS[n - 1] - t.timeS[from - 1] <= LIVE_WINDOW_S) from--;
      setLive({
        timeS: t.timeS.slice(from),
        values: t.rate[axis].slice(from),
        count: n,
        durationS: t.timeS[n - 1],
      });
    }, REDRAW_MS);
    return () => clearInterval(timer);
  }, [state]);

  /** Must run from the tap itself: Safari asks for motion access only in answer to a tap. */
  const start = useCallback(async () => {
    setError(null);
    setState('asking');
    const refused = await askMotionPermission();
    if (refused) {
      setError(refused);
      setState('idle');
      return;
    }
    trace.current = emptyTrace();
    setLive({ timeS: [], values: [], count: 0, durationS: 0 });
    stopRef.current = startMotionCapture(
      (s) => {
        appendSample(trace.current, s);
      },
      () =>
        setError(
          'This device gives no rotation rate (no gyroscope): a ride cycle cannot be recorded with it.',
        ),
    );
    setState('recording');
  }, []);

  const stop = useCallback(() => {
    stopSensors();
    setState('stopped');
  }, []);

  const reset = useCallback(() => {
    stopSensors();
    trace.current = emptyTrace();
    setState('idle');
    setError(null);
  }, []);

  return { state, error, live, trace, start, stop, reset };
}
