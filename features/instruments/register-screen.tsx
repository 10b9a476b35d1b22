import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { DataTable } from '@/components/data-table';
import Feather from '@/components/feather-icon';
import { QueryState } from '@/components/query-state';
import { Screen } from '@/components/screen';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { ApiRequestError } from '@/lib/api-errors';
import { RoleGate } from '@/features/auth/ui';
import type { SessionUser } from '@/features/session/schema';
import { readingKindLabel } from '@/features/records/schema';
import {
  useDeclarationSaveMutation,
  instrumentKeys,
  useDeclarationSettingQuery,
  useInstrumentListQuery,
} from '@/features/instruments/api';
import {
  type Instrument,
  calibrationStatus,
  calibrationWords,
  readingMethodWords,
} from '@/features/instruments/schema';
import { Panes } from '@/components/panes';
import { RegisterTabs } from '@/features/registry/ui';
import { formatDate, formatDateTime, localDay } from '@/lib/dates';
import { InstrumentForm } from '@/features/instruments/instrument-form';

const staff = ['admin', 'supervisor', 'inspector'] as const;

/**
 * The inspection body's measuring instruments with their calibration dates, and the declaration its
 * inspectors make at submit. Staff read both; admins change them. Inspectors' phones get both by sync.
 */
export function InstrumentRegisterScreen() {
  return <RoleGate roles={staff}>{(user) => <Register user={user} />}</RoleGate>;
}

type Editing = { id: string | null; initial: Instrument | null } | null;

function Register({ user }: { user: SessionUser }) {
  const list = useInstrumentListQuery();
  const [editing, setEditing] = useState<Editing>(null);
  const [removed, setRemoved] = useState<string | null>(null);
  const client = useQueryClient();
  const admin = user.role === 'admin';
  return (
    <Screen
      title="Instruments"
      subtitle="Measuring instruments, their calibration, and the inspectors’ declaration."
      actions={
        admin && !editing ? (
          <Button
            label="New instrument"
            tone="accent"
            icon={<Feather name="plus" size={18} color={colors.baseText} />}
            onPress={() => {
              setRemoved(null);
              setEditing({ id: null, initial: null });
            }}
          />
        ) : null
      }
    >
      <RegisterTabs role={user.role} />
      <Panes
        sideFirstOnPhone={false}
        mainGrow={3}
        main={
          <>
            {editing ? (
              <InstrumentForm
                key={editing.id ?? 'new'}
                id={editing.id}
                initial={editing.initial}
                onDone={() => setEditing(null)}
                onDeleted={(message) => {
                  setEditing(null);
                  setRemoved(message);
                  void client.invalidateQueries({ queryKey: instrumentKeys.all });
                }}
              />
            ) : null}
            {removed ? (
              <Text role="status" color={colors.textMuted}>
                {removed}
              </Text>
            ) : null}
            <QueryState query={list}>
              {(instruments) => (
                <InstrumentTable
                  instruments={instruments}
                  onEdit={
                    admin
                      ? (i) => {
                          setRemoved(null);
                          setEditing({ id: i.id, initial: i });
                        }
                      : undefined
                  }
                />
              )}
            </QueryState>
          </>
        }
        side={<DeclarationCard admin={admin} />}
      />
    </Screen>
  );
}

const statusIcon = {
  current: { icon: 'check-circle', color: colors.within },
  not_required: { icon: 'minus-circle', color: colors.textMuted },
  due_soon: { icon: 'alert-triangle', color: colors.near },
  past_due: { icon: 'slash', color: colors.over },
} as const;

function CalibrationCell({ instrument }: { instrument: Instrument }) {
  const status = calibrationStatus(instrument.calibrationDueOn, localDay());
  const mark = statusIcon[status.state];
  return (
    <View style={styles.status}>
      <Feather name={mark.icon} size={14} color={mark.color} />
      <Text
        variant="small"
        color={status.state === 'current' || status.state === 'not_required' ? colors.text : mark.color}
      >
        {calibrationWords(instrument.calibrationDueOn, status)}
      </Text>
    </View>
  );
}

function InstrumentTable({
  instruments,
  onEdit,
}: {
  instruments: Instrument[];
  onEdit?: (i: Instrument) => void;
}) {
  if (instruments.length === 0)
    return (
      <Card>
        <Text muted>
          No instruments yet. Inspectors can then only record readings as “none from the register”.
        </Text>
      </Card>
    );
  // In use first, by name; retired ones after, kept for the readings that name them.
  const rows = [...instruments].sort(
    (a, b) => Number(a.retiredAt !== null) - Number(b.retiredAt !== null) || a.name.localeCompare(b.name),
  );
  return (
    <DataTable
      label="Instruments"
      rows={rows}
      rowKey={(i) => i.id}
      columns={[
        {
          key: 'name',
          title: 'Instrument',
          flex: 1.7,
          render: (i) => (i.retiredAt ? `${i.name} (retired)` : i.name),
        },
        { key: 'serial', title: 'Serial', flex: 1.1, render: (i) => i.serial },
        { key: 'method', title: 'Kind', flex: 1.2, render: (i) => readingMethodWords[i.method] },
        {
          key: 'kinds',
          title: 'Measures',
          flex: 1.2,
          render: (i) => i.kinds.map((k) => readingKindLabel[k]).join(', '),
        },
        {
          key: 'calibrated',
          title: 'Calibrated',
          flex: 1.2,
          render: (i) => (i.calibratedOn ? formatDate(i.calibratedOn) : '—'),
        },
        {
          key: 'due',
          title: 'Next due',
          flex: 1.8,
          render: (i) => (i.retiredAt ? 'Retired' : <CalibrationCell instrument={i} />),
        },
        ...(onEdit
          ? [
              {
                key: 'edit',
                title: '',
                flex: 0.8,
                render: (i: Instrument) => (
                  <Button
                    label="Edit"
                    tone="quiet"
                    onPress={() => onEdit(i)}
                    accessibilityLabel={`Edit ${i.name} (${i.serial})`}
                  />
                ),
              },
            ]
          : []),
      ]}
    />
  );
}

function DeclarationCard({ admin }: { admin: boolean }) {
  const setting = useDeclarationSettingQuery();
  const save = useDeclarationSaveMutation();
  const [draft, setDraft] = useState<string | null>(null);
  const issues = save.error instanceof ApiRequestError ? save.error.issues : [];
  return (
    <Card>
      <Text variant="heading">Inspector’s declaration</Text>
      <Text variant="small" muted>
        Shown to the inspector at submit; they tick it, and the record keeps this text with their name and the
        time.
      </Text>
      <QueryState query={setting}>
        {(d) =>
          draft !== null ? (
            <View style={styles.group}>
              <TextField
                label="Declaration text"
                value={draft}
                onChangeText={setDraft}
                multiline
                error={issues.find((i) => i.path === 'text')?.message}
              />
              <View style={styles.actions}>
                <Button
                  label="Save declaration"
                  tone="accent"
                  busy={save.isPending}
                  onPress={async () => {
                    try {
                      await save.mutateAsync(draft);
                      setDraft(null);
                    } catch {
                      // Shown under the field.
                    }
                  }}
                />
                <Button label="Cancel" tone="quiet" onPress={() => setDraft(null)} />
              </View>
            </View>
          ) : (
            <View style={styles.group}>
              <View style={styles.quote}>
                <Text>{d.text}</Text>
              </View>
              <Text variant="small" muted>
                {d.updatedAt
                  ? `Set by ${d.updatedByName ?? 'an administrator'} on ${formatDateTime(d.updatedAt)}`
                  : 'The standard text; no administrator has set the inspection body’s own yet.'}
              </Text>
              {admin ? (
                <Button label="Change the text" tone="quiet" onPress={() => setDraft(d.text)} />
              ) : null}
            </View>
          )
        }
      </QueryState>
    </Card>
  );
}

const styles = StyleSheet.create({
  status: { flexDirection: 'row', alignItems: 'center', gap: space.xs, flexWrap: 'wrap' },
  group: { gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  quote: {
    borderLeftWidth: 3,
    borderLeftColor: colors.base,
    backgroundColor: colors.bg,
    padding: space.md,
  },
});
