import { ProgressBar } from '@/components/progress-bar';
import { readCsv } from '@/features/registry/design-file/csv-text';

/**
 * Where an import of a design file stands: reading the picked file on this device, then the server
 * parsing and checking it whole (one request: it answers all at once, so the bar moves by step, with the
 * rows counted when the file is read), then the comparison with the version in force.
 */
export type ImportPhase =
  { step: 'reading' } | { step: 'checking'; rows: number | null; format: 'csv' | 'json' };

const STEPS = 3;

/**
 * Data rows of a CSV, read by the same reader the import uses (quoted line breaks stay in their cell):
 * every record less the header line (RFC 4180 §2.3). Null when it cannot be read: the check says why.
 */
export function csvDataRows(text: string): number | null {
  const { records, error } = readCsv(text.replace(/^\uFEFF/, ''));
  return error ? null : Math.max(0, records.length - 1);
}

export function importPhaseText(phase: ImportPhase): string {
  if (phase.step === 'reading') return 'Reading the file (step 1 of 3)';
  const what = phase.rows === null ? 'the file' : `${phase.rows} row${phase.rows === 1 ? '' : 's'}`;
  return `The server is parsing and checking ${what} (step 2 of 3)`;
}

export function ImportProgress({ phase }: { phase: ImportPhase | null }) {
  if (!phase) return null;
  return (
    <ProgressBar
      label="Importing the design file"
      value={phase.step === 'reading' ? 0 : 1}
      max={STEPS}
      valueText={importPhaseText(phase)}
      caption={false}
    />
  );
}
