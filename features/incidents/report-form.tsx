import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { CheckField } from '@/components/check-field';
import { DateField } from '@/components/date-field';
import { FieldFrame } from '@/components/field-frame';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { RadioGroup, RadioOption } from '@/components/radio-option';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, radius, space } from '@/components/theme';
import {
  incidentInputSchema,
  incidentKinds,
  incidentKindVocabulary,
  type IncidentCreated,
  type IncidentInput,
  type IncidentKind,
  type RideIncidentsResponse,
} from '@/features/incidents/schema';
import { useReportIncident } from '@/features/incidents/api';
import { EvidencePhotos, problemText, useEvidencePhotos } from '@/features/notices/ui';
import { ApiRequestError } from '@/lib/api-errors';
import { localStampInZone } from '@/lib/dates';

type Field =
  'kind' | 'occurredAt' | 'what' | 'ridersAffected' | 'anyoneHurt' | 'stoppedAt' | 'runningAgainAt';
type FieldErrors = Partial<Record<Field, string>>;
const FIELDS: readonly string[] = [
  'kind',
  'occurredAt',
  'what',
  'ridersAffected',
  'anyoneHurt',
  'stoppedAt',
  'runningAgainAt',
] satisfies Field[];

/** A day and a time as typed; the schema checks the pair as one stamp. */
type Stamp = { day: string | null; time: string };

/** Nothing typed is no stamp; anything typed is checked whole (a day without a time is an error). */
export function stampOf(s: Stamp): string | undefined {
  const time = s.time.trim();
  if (!s.day && !time) return undefined;
  return `${s.day ?? ''}T${time}`;
}

/** The form's fields as the API takes them (the schema then judges them, here and on the server). */
export type IncidentDraft = {
  kind: IncidentKind | null;
  occurred: Stamp;
  what: string;
  riders: string;
  hurt: 'yes' | 'no' | null;
  stopped: Stamp;
  back: Stamp;
  stopRide: boolean;
};

export function draftInput(d: IncidentDraft, photoShas: string[]): Record<string, unknown> {
  const riders = d.riders.trim();
  return {
    kind: d.kind ?? undefined,
    occurredAt: stampOf(d.occurred),
    what: d.what,
    ridersAffected: riders === '' ? undefined : Number(riders),
    anyoneHurt: d.hurt === null ? undefined : d.hurt === 'yes',
    stoppedAt: stampOf(d.stopped),
    runningAgainAt: stampOf(d.back),
    photoShas,
    stopRide: d.stopRide,
  };
}

/** Each field's first problem, by the schema's path. */
export function fieldErrorsOf(issues: readonly { path: string; message: string }[]): FieldErrors {
  const out: FieldErrors = {};
  for (const i of issues) {
    const field = i.path.split('.')[0];
    if (FIELDS.includes(field) && !out[field as Field]) out[field as Field] = i.message;
  }
  return out;
}

const emptyStamp: Stamp = { day: null, time: '' };

/**
 * The operator's incident report: what kind, when (on the site's clock), what happened, riders affected,
 * whether anyone was hurt, the downtime, photos, and whether to take the ride out of service now. Checked
 * by the shared schema before anything is sent; photos upload as they are taken. Online only: without a
 * connection it says so and keeps everything typed.
 */
export function IncidentReportForm({
  ride,
  onSent,
}: {
  ride: RideIncidentsResponse;
  onSent: (created: IncidentCreated) => void;
}) {
  const zone = ride.timeZone;
  const [draft, setDraft] = useState<IncidentDraft>(() => {
    const [day, time] = localStampInZone(new Date(), zone).split('T');
    return {
      kind: null,
      occurred: { day, time },
      what: '',
      riders: '',
      hurt: null,
      stopped: emptyStamp,
      back: emptyStamp,
      stopRide: false,
    };
  });
  const [errors, setErrors] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const [sending, setSending] = useState(false);
  const photos = useEvidencePhotos(setProblem);
  const report = useReportIncident(ride.rideId);
  const today = localStampInZone(new Date(), zone).slice(0, 10);
  const canStop = ride.rideStatus !== 'out_of_service';

  const set = <K extends keyof IncidentDraft>(key: K, value: IncidentDraft[K], field?: Field) => {
    setDraft((d) => ({ ...d, [key]: value }));
    if (field && errors[field]) setErrors((e) => ({ ...e, [field]: undefined }));
  };

  const submit = async () => {
    setProblem(null);
    const checked = incidentInputSchema.safeParse(
      draftInput(
        draft,
        photos.photos.map((p) => p.sha256),
      ),
    );
    if (!checked.success) {
      setErrors(
        fieldErrorsOf(checked.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))),
      );
      setProblem({ message: 'Some answers need attention; nothing was sent.' });
      return;
    }
    setErrors({});
    setSending(true);
    try {
      try {
        for (const p of photos.photos) await photos.upload(p);
      } catch (err) {
        setProblem({
          message: 'A photo could not be uploaded, so the report was not sent.',
          details: [problemText(err), 'Everything you typed is still here. Try again, or remove that photo.'],
        });
        return;
      }
      const created = await report.mutateAsync(checked.data satisfies IncidentInput);
      onSent(created);
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues.length > 0) {
        setErrors(fieldErrorsOf(err.issues));
        setProblem({
          message: err.message,
          details: err.issues.filter((i) => !FIELDS.includes(i.path.split('.')[0])).map((i) => i.message),
        });
      } else
        setProblem({
          message: `The report was not sent. ${problemText(err)}`,
          details: ['Everything you typed and the photos stay here; send again when you can.'],
        });
    } finally {
      setSending(false);
    }
  };

  return (
    <View style={styles.form} accessibilityLabel="Incident report">
      <FieldFrame label="What happened?" error={errors.kind}>
        <RadioGroup
          label="What happened?"
          value={draft.kind}
          values={incidentKinds}
          onChange={(k) => set('kind', k, 'kind')}
          style={styles.choices}
        >
          {incidentKinds.map((k) => (
            <RadioOption key={k} value={k} label={incidentKindVocabulary[k].label} invalid={!!errors.kind}>
              <View style={styles.choiceText}>
                <Text variant="heading">{incidentKindVocabulary[k].label}</Text>
                <Text variant="small" muted>
                  {incidentKindVocabulary[k].description}
                </Text>
              </View>
            </RadioOption>
          ))}
        </RadioGroup>
      </FieldFrame>

      <StampFields
        label="When it happened"
        stamp={draft.occurred}
        onChange={(s) => set('occurred', s, 'occurredAt')}
        error={errors.occurredAt}
        hint={`On the site’s clock (${zone}).`}
        max={today}
      />

      <TextField
        label="What happened"
        value={draft.what}
        onChangeText={(t) => set('what', t, 'what')}
        multiline
        error={errors.what}
        hint="The first line is the report’s title in lists. Then what you saw, where on the ride, what was done."
      />

      <TextField
        label="Riders affected"
        value={draft.riders}
        onChangeText={(t) => set('riders', t, 'ridersAffected')}
        keyboardType="number-pad"
        inputMode="numeric"
        error={errors.ridersAffected}
        hint="Riders on the ride or involved; 0 if none."
      />

      <FieldFrame label="Was anyone hurt?" error={errors.anyoneHurt}>
        <RadioGroup
          label="Was anyone hurt?"
          value={draft.hurt}
          values={['yes', 'no'] as const}
          onChange={(v) => set('hurt', v, 'anyoneHurt')}
          style={styles.yesNo}
        >
          <RadioOption
            value="yes"
            label="Yes, someone was hurt"
            invalid={!!errors.anyoneHurt}
            style={styles.flex}
          >
            <Text>Yes</Text>
          </RadioOption>
          <RadioOption value="no" label="No one was hurt" invalid={!!errors.anyoneHurt} style={styles.flex}>
            <Text>No</Text>
          </RadioOption>
        </RadioGroup>
      </FieldFrame>

      <Card>
        <Text variant="heading">Downtime</Text>
        <Text variant="small" muted>
          If the ride stopped: when, and when it ran again. Leave empty what you do not know.
        </Text>
        <StampFields
          label="Stopped at"
          stamp={draft.stopped}
          onChange={(s) => set('stopped', s, 'stoppedAt')}
          error={errors.stoppedAt}
          max={today}
        />
        <StampFields
          label="Back running at"
          stamp={draft.back}
          onChange={(s) => set('back', s, 'runningAgainAt')}
          error={errors.runningAgainAt}
          max={today}
        />
      </Card>

      <FieldFrame label="Photos">
        <EvidencePhotos
          photos={photos.photos}
          picking={photos.picking}
          sending={sending}
          onPick={photos.pick}
          onRetry={(p) => photos.upload(p).catch(() => undefined)}
          onRemove={photos.remove}
        />
      </FieldFrame>

      {canStop ? (
        <View style={[styles.stop, draft.stopRide && styles.stopOn]}>
          <CheckField
            label="Stop the ride and ask for an inspection"
            value={draft.stopRide}
            onChange={(v) => set('stopRide', v, 'runningAgainAt')}
            icon="alert-octagon"
          />
          <Text variant="small">
            The ride goes out of service when the report is sent, with this report as the reason, and the
            inspection body is asked for a follow-up inspection. Only the inspection body puts it back in
            service: an approved follow-up inspection or a supervisor’s decision.
          </Text>
        </View>
      ) : (
        <Text variant="small" muted>
          The ride is out of service already; the inspection body sees this report in its review queue.
        </Text>
      )}

      <FormAlert problem={problem} />
      <Button
        label={draft.stopRide ? 'Send report and stop the ride' : 'Send report'}
        tone={draft.stopRide ? 'danger' : 'accent'}
        onPress={submit}
        busy={sending}
      />
    </View>
  );
}

/** A date (the platform's picker) and a time typed as HH:MM, side by side: one stamp on the site's clock. */
function StampFields({
  label,
  stamp,
  onChange,
  error,
  hint,
  max,
}: {
  label: string;
  stamp: Stamp;
  onChange: (s: Stamp) => void;
  error?: string;
  hint?: string;
  max: string;
}) {
  return (
    <View style={styles.stamp}>
      <View style={styles.day}>
        <DateField
          label={`${label}: date`}
          value={stamp.day}
          onChange={(day) => onChange({ ...stamp, day })}
          max={max}
          hint={hint}
        />
      </View>
      <View style={styles.time}>
        <TextField
          label={`${label}: time`}
          value={stamp.time}
          onChangeText={(time) => onChange({ ...stamp, time })}
          placeholder="HH:MM"
          keyboardType="numbers-and-punctuation"
          error={error}
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  choices: { gap: space.xs },
  choiceText: { flex: 1, gap: 2 },
  yesNo: { flexDirection: 'row', gap: space.sm },
  flex: { flex: 1 },
  stamp: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  day: { flexGrow: 3, flexBasis: 180 },
  time: { flexGrow: 1, flexBasis: 110 },
  stop: {
    gap: space.sm,
    padding: space.md,
    borderWidth: 2,
    borderColor: colors.border,
    borderRadius: radius.md,
  },
  stopOn: { borderColor: colors.over, backgroundColor: colors.overSoft },
});
