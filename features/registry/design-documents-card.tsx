import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { ChoiceChips } from '@/components/choice-chips';
import { DateField } from '@/components/date-field';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { ProgressBar } from '@/components/progress-bar';
import { Spinner } from '@/components/spinner';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { downloadPdf } from '@/features/api/ui';
import { MAX_DOCUMENT_BYTES, megabytes } from '@/features/documents';
import { documentPath, pickPdf, type PickedPdf } from '@/features/documents/ui';
import {
  useAttachDesignDocumentMutation,
  useDetachDesignDocumentMutation,
  useRideDocumentsQuery,
  useVersionDocumentsQuery,
} from '@/features/registry/design-documents-api';
import { designDocumentInputSchema, type DesignDocument } from '@/features/registry/schema';
import { ApiRequestError } from '@/lib/api-errors';
import { formatBytes } from '@/lib/bytes';
import { formatDate } from '@/lib/dates';
import { designDocumentKinds, designDocumentKindVocabulary, type DesignDocumentKind } from '@/lib/vocabulary';

/** "Maker’s manual · Issue 3 · issued 30 Apr 2024", and where it came from when carried over. */
export function designDocumentLines(d: DesignDocument): { kind: string; origin: string | null } {
  const kind = [
    designDocumentKindVocabulary[d.kind].label,
    d.revision,
    d.issuedOn ? `issued ${formatDate(d.issuedOn)}` : null,
  ]
    .filter(Boolean)
    .join(' · ');
  const origin =
    d.firstVersion < d.version
      ? `Carried from version ${d.firstVersion} (attached ${formatDate(d.attachedAt)}${d.attachedByName ? ` by ${d.attachedByName}` : ''})`
      : `Attached to this version ${formatDate(d.attachedAt)}${d.attachedByName ? ` by ${d.attachedByName}` : ''}`;
  return { kind, origin };
}

const fileNameOf = (d: DesignDocument) =>
  `${d.title.replace(/[^\w.-]+/g, '_').slice(0, 60) || 'document'}.pdf`;

function DocumentRow({
  document: d,
  onRemove,
}: {
  document: DesignDocument;
  onRemove?: () => Promise<void>;
}) {
  const [message, setMessage] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const lines = designDocumentLines(d);
  const open = async () => {
    try {
      setMessage(await downloadPdf(documentPath(d.sha256), fileNameOf(d)));
    } catch (err) {
      setMessage(err instanceof Error ? err.message : 'The document could not be opened.');
    }
  };
  const remove = async () => {
    try {
      await onRemove?.();
    } catch (err) {
      setConfirming(false);
      setMessage(err instanceof Error ? err.message : 'The document could not be removed.');
    }
  };
  return (
    <View style={styles.row} testID={`design-document-${d.id}`} accessibilityLabel={d.title}>
      <Text variant="heading">{d.title}</Text>
      <Text variant="small">{lines.kind}</Text>
      {lines.origin ? (
        <Text variant="small" muted>
          {lines.origin}
        </Text>
      ) : null}
      <View style={styles.actions}>
        {/* A short label that fits a phone; the accessible name says which document. */}
        <Button tone="quiet" label="Open PDF" accessibilityLabel={`Open ${d.title}`} onPress={open} />
        {onRemove && !confirming ? (
          <Button tone="quiet" label="Remove" onPress={() => setConfirming(true)} />
        ) : null}
      </View>
      {confirming ? (
        <View style={styles.confirm} role="alert">
          <Text variant="small">
            Remove “{d.title}” from version {d.version}? Earlier versions keep it, the file stays stored and
            the history of changes records who removed it.
          </Text>
          <View style={styles.actions}>
            <Button tone="danger" label="Remove from this version" onPress={remove} />
            <Button tone="quiet" label="Keep it" onPress={() => setConfirming(false)} />
          </View>
        </View>
      ) : null}
      {message ? (
        <Text variant="small" role="status" muted>
          {message}
        </Text>
      ) : null}
    </View>
  );
}

function DocumentList({
  documents,
  empty,
  onRemove,
}: {
  documents: DesignDocument[];
  empty: string;
  onRemove?: (d: DesignDocument) => Promise<void>;
}) {
  if (documents.length === 0)
    return (
      <Text variant="small" muted>
        {empty}
      </Text>
    );
  return (
    <View accessibilityLabel="Design documents">
      {documents.map((d) => (
        <DocumentRow key={d.id} document={d} onRemove={onRemove ? () => onRemove(d) : undefined} />
      ))}
    </View>
  );
}

/**
 * A design-data version's documents (design reports, makers' manuals, drawings, certificates): each opens
 * as its PDF, says which version it was first attached to, and — for supervisors and admins — can be
 * removed from this version or joined by another.
 */
export function DesignDocumentsCard({
  rideId,
  version,
  editable,
}: {
  rideId: string;
  version: number;
  editable: boolean;
}) {
  const docs = useVersionDocumentsQuery(rideId, version);
  const detach = useDetachDesignDocumentMutation(rideId, version);
  return (
    <Card accessibilityLabel={`Documents of version ${version}`}>
      <Text variant="heading">Documents</Text>
      <Text variant="small" muted>
        Design reports, makers’ manuals, drawings and certificates of version {version}. A new version starts
        with these.
      </Text>
      {docs.isPending ? (
        <Spinner color={colors.base} />
      ) : !docs.data ? (
        <Text muted role="alert">
          The documents could not be loaded.
        </Text>
      ) : (
        <DocumentList
          documents={docs.data.documents}
          empty="No documents on this version."
          onRemove={
            editable
              ? async (d) => {
                  await detach.mutateAsync(d.id);
                }
              : undefined
          }
        />
      )}
      {editable ? <AttachDocument rideId={rideId} version={version} /> : null}
    </Card>
  );
}

/** The documents of the design data in force, read-only: for the ride's operator and everyone else. */
export function RideDocumentsCard({ rideId }: { rideId: string }) {
  const docs = useRideDocumentsQuery(rideId);
  return (
    <Card accessibilityLabel="Ride documents">
      <Text variant="heading">Ride documents</Text>
      {docs.isPending ? (
        <Spinner color={colors.base} />
      ) : !docs.data ? (
        <Text muted role="alert">
          The documents could not be loaded.
        </Text>
      ) : (
        <>
          <Text variant="small" muted>
            {docs.data.version === null
              ? 'This ride has no design data yet.'
              : `Attached to design data version ${docs.data.version}, the version in force.`}
          </Text>
          <DocumentList documents={docs.data.documents} empty="No documents attached yet." />
        </>
      )}
    </Card>
  );
}

type Field = 'file' | 'kind' | 'title' | 'revision' | 'issuedOn';
type FieldErrors = Partial<Record<Field, string>>;

function fieldErrorsOf(issues: readonly { path: string; message: string }[]): FieldErrors {
  const out: FieldErrors = {};
  for (const i of issues) {
    const head = i.path.split('.')[0];
    const key = (head === 'sha256' ? 'file' : head) as Field;
    if (['file', 'kind', 'title', 'revision', 'issuedOn'].includes(key) && !out[key]) out[key] = i.message;
  }
  return out;
}

function AttachDocument({ rideId, version }: { rideId: string; version: number }) {
  const attach = useAttachDesignDocumentMutation(rideId, version);
  const [file, setFile] = useState<PickedPdf | null>(null);
  const [kind, setKind] = useState<DesignDocumentKind | null>(null);
  const [title, setTitle] = useState('');
  const [revision, setRevision] = useState('');
  const [issuedOn, setIssuedOn] = useState<string | null>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [sending, setSending] = useState<{ sent: number; total: number } | null>(null);

  const pick = async () => {
    setErrors((e) => ({ ...e, file: undefined }));
    const picked = await pickPdf(MAX_DOCUMENT_BYTES);
    if (picked === null) return;
    if ('problem' in picked) setErrors((e) => ({ ...e, file: picked.problem }));
    else {
      setFile(picked);
      if (title.trim() === '') setTitle(picked.name.replace(/\.pdf$/i, ''));
    }
  };

  const submit = async () => {
    setSaved(null);
    setProblem(null);
    const parsed = designDocumentInputSchema.omit({ sha256: true }).safeParse({
      kind: kind ?? undefined,
      title,
      revision: revision.trim() === '' ? null : revision,
      issuedOn,
    });
    const found: FieldErrors = parsed.success
      ? {}
      : fieldErrorsOf(parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })));
    if (!file) found.file = 'Choose the PDF to attach';
    if (!parsed.success || !file) {
      setErrors(found);
      return;
    }
    setErrors({});
    try {
      setSending({ sent: 0, total: file.bytes.length });
      const res = await attach
        .mutateAsync({
          input: parsed.data,
          bytes: file.bytes,
          onProgress: (sent, total) => setSending({ sent, total }),
        })
        .finally(() => setSending(null));
      setSaved(`Attached “${res.document.title}” to version ${version}.`);
      setFile(null);
      setKind(null);
      setTitle('');
      setRevision('');
      setIssuedOn(null);
    } catch (err) {
      if (err instanceof ApiRequestError) {
        setErrors(fieldErrorsOf(err.issues));
        setProblem({ message: err.message });
      } else
        setProblem({ message: 'The document could not be attached. Check the connection and try again.' });
    }
  };

  return (
    <View style={styles.form} accessibilityLabel="Attach a document">
      <Text variant="label" muted>
        ATTACH A PDF (AT MOST {megabytes(MAX_DOCUMENT_BYTES)})
      </Text>
      {file ? (
        <Text testID="design-document-picked">
          PDF: {file.name} · {formatBytes(file.bytes.length)}
        </Text>
      ) : null}
      <View style={styles.actions}>
        <Button tone="quiet" label={file ? 'Choose another PDF' : 'Choose PDF'} onPress={pick} />
      </View>
      {errors.file ? (
        <Text variant="small" color={colors.over} role="alert">
          {errors.file}
        </Text>
      ) : null}
      <ChoiceChips
        label="Kind"
        value={kind}
        options={designDocumentKinds.map((k) => ({ value: k, label: designDocumentKindVocabulary[k].label }))}
        onChange={setKind}
        error={errors.kind}
      />
      <TextField label="Title" value={title} onChangeText={setTitle} maxLength={200} error={errors.title} />
      <TextField
        label="Revision or issue (optional)"
        value={revision}
        onChangeText={setRevision}
        maxLength={40}
        error={errors.revision}
      />
      <DateField
        label="Issued on (optional)"
        value={issuedOn}
        onChange={setIssuedOn}
        error={errors.issuedOn}
      />
      <FormAlert problem={problem} />
      {saved ? (
        <Text role="status" color={colors.within}>
          ✓ {saved}
        </Text>
      ) : null}
      {sending ? (
        <ProgressBar
          label="Sending the document"
          value={sending.sent}
          max={sending.total}
          valueText={`Sending the PDF: ${formatBytes(sending.sent)} of ${formatBytes(sending.total)}`}
        />
      ) : null}
      <Button label="Attach document" onPress={submit} busy={attach.isPending} />
    </View>
  );
}

const styles = StyleSheet.create({
  row: { gap: 2, borderTopWidth: 1, borderTopColor: colors.border, paddingVertical: space.sm },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
  confirm: { gap: space.xs, backgroundColor: colors.nearSoft, padding: space.sm, borderRadius: 6 },
  form: { gap: space.sm, borderTopWidth: 1, borderTopColor: colors.border, paddingTop: space.md },
});
