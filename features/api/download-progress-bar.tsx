import { useCallback, useState } from 'react';

import { ProgressBar } from '@/components/progress-bar';
import { formatBytes } from '@/lib/bytes';
import type { DownloadProgress, DownloadStep } from '@/features/api/download-progress';

const STEPS: DownloadStep[] = ['preparing', 'downloading', 'saving'];
const STEP_WORDS: Record<DownloadStep, string> = {
  preparing: 'The server is making the file',
  downloading: 'Downloading',
  saving: 'Saving',
};

/** The read-out: bytes of the whole while they arrive (when the length is known), else the step. */
export function downloadProgressText(p: DownloadProgress): string {
  const step = `step ${STEPS.indexOf(p.step) + 1} of ${STEPS.length}`;
  if (p.step === 'downloading')
    return p.totalBytes !== null
      ? `${formatBytes(p.receivedBytes)} of ${formatBytes(p.totalBytes)}`
      : `${STEP_WORDS.downloading}, ${formatBytes(p.receivedBytes)} so far (${step})`;
  return `${STEP_WORDS[p.step]} (${step})`;
}

/**
 * A file on its way from the API: determinate by bytes while they arrive with a known length, otherwise
 * by its three steps (the server making it, downloading, saving). `label` names the file.
 */
export function DownloadProgressBar({
  progress,
  label,
}: {
  progress: DownloadProgress | null;
  label: string;
}) {
  if (!progress) return null;
  const bytes = progress.step === 'downloading' && progress.totalBytes !== null;
  return (
    <ProgressBar
      label={label}
      value={bytes ? progress.receivedBytes : STEPS.indexOf(progress.step)}
      max={bytes ? progress.totalBytes : STEPS.length}
      valueText={downloadProgressText(progress)}
      caption={false}
    />
  );
}

/** The progress of one download at a time: `track` to pass as `onProgress`, `clear` when it ends. */
export function useDownloadProgress() {
  const [progress, setProgress] = useState<DownloadProgress | null>(null);
  const track = useCallback((p: DownloadProgress) => setProgress(p), []);
  const clear = useCallback(() => setProgress(null), []);
  return { progress, track, clear };
}
