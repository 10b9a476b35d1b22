import { type Href, Link } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import Feather from '@/components/feather-icon';
import { IconButton } from '@/components/icon-button';
import { LabelledLine } from '@/components/labelled-line';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { formatDate, formatDateTime, localDay } from '@/lib/dates';
import type { ListedFinding } from '@/features/review/decision-api';
import { type InspectionPhoto, photoName } from '@/features/review/finding-form';
import { FindingStateMark, SeverityMark } from '@/features/notices/ui';

/**
 * The inspection's findings in number order. While the inspection is open for decisions each one can be
 * edited (the editor takes its place) or deleted after a second press; rows the server has not yet
 * confirmed say so and cannot be touched. Once approved, each says where it stands (open, action
 * reported, closed), and one with a corrective action waiting leads to the notice where it is verified.
 */
export function FindingsList({
  findings,
  photos,
  editable,
  actionHref = null,
  editingId,
  editor,
  onEdit,
  onDelete,
}: {
  findings: readonly ListedFinding[];
  photos: readonly InspectionPhoto[];
  editable: boolean;
  /** The notice where a reported corrective action is verified (closed or reopened). */
  actionHref?: Href | null;
  /** The finding whose editor is open, shown in place of its row. */
  editingId: string | null;
  editor: React.ReactNode;
  onEdit: (finding: ListedFinding) => void;
  onDelete: (finding: ListedFinding) => void;
}) {
  const [confirming, setConfirming] = useState<string | null>(null);
  if (findings.length === 0)
    return (
      <Text muted accessibilityLabel="No findings">
        No findings recorded for this inspection.
      </Text>
    );
  const today = localDay();
  const sorted = [...findings].sort((a, b) => a.number - b.number);
  return (
    <View style={styles.list} role="list" accessibilityLabel="Findings">
      {sorted.map((f) => {
        if (f.id === editingId)
          return (
            <View key={f.id} style={styles.editing}>
              {editor}
            </View>
          );
        return (
          <FindingRow
            key={f.id}
            finding={f}
            photos={photos}
            editable={editable}
            actionHref={actionHref}
            pastDue={f.dueOn !== null && f.state !== 'closed' && f.dueOn < today}
            confirming={confirming === f.id}
            onConfirming={(on) => setConfirming(on ? f.id : null)}
            onEdit={onEdit}
            onDelete={onDelete}
          />
        );
      })}
    </View>
  );
}

/** One finding: its number, severity and state, what it says, and its edit and delete actions. */
function FindingRow({
  finding: f,
  photos,
  editable,
  actionHref,
  pastDue,
  confirming,
  onConfirming,
  onEdit,
  onDelete,
}: {
  finding: ListedFinding;
  photos: readonly InspectionPhoto[];
  editable: boolean;
  actionHref: Href | null;
  pastDue: boolean;
  /** The second press that deletes it is being asked for. */
  confirming: boolean;
  onConfirming: (confirming: boolean) => void;
  onEdit: (finding: ListedFinding) => void;
  onDelete: (finding: ListedFinding) => void;
}) {
  return (
    <View
      role="listitem"
      accessibilityLabel={`Finding ${f.number}`}
      style={StyleSheet.flatten([styles.row, f.saving && styles.saving])}
    >
      <View style={styles.head}>
        <Text variant="figure" style={styles.number}>
          {f.number}
        </Text>
        <SeverityMark severity={f.severity} compact />
        {!editable || f.state !== 'open' ? <FindingStateMark state={f.state} /> : null}
        {f.saving ? (
          <Text variant="label" color={colors.focus} accessibilityLiveRegion="polite">
            Saving…
          </Text>
        ) : null}
        <View style={styles.spacer} />
        {editable && !f.saving ? (
          <View style={styles.actions}>
            <IconButton icon="edit-2" label={`Edit finding ${f.number}`} onPress={() => onEdit(f)} />
            <IconButton
              icon="trash-2"
              tone="danger"
              label={`Delete finding ${f.number}`}
              onPress={() => onConfirming(true)}
            />
          </View>
        ) : null}
      </View>
      <Text>{f.description}</Text>
      {f.ruleRef ? <LabelledLine label="Breaches" value={f.ruleRef} /> : null}
      {f.requiredAction ? <LabelledLine label="Required action" value={f.requiredAction} /> : null}
      {f.dueOn ? (
        <LabelledLine
          label="Due"
          value={pastDue ? `${formatDate(f.dueOn)} — past due` : formatDate(f.dueOn)}
          color={pastDue ? colors.danger : undefined}
        />
      ) : null}
      {f.photoShas.length > 0 ? (
        <LabelledLine label="Photos" value={f.photoShas.map((sha) => photoName(photos, sha)).join(' · ')} />
      ) : null}
      {f.state === 'closed' && f.closedAt ? (
        <LabelledLine
          label="Closed"
          value={`${formatDateTime(f.closedAt)}${f.closedByName ? ` by ${f.closedByName}` : ''}`}
        />
      ) : null}
      {f.stateNote ? <LabelledLine label="Comment" value={f.stateNote} /> : null}
      {f.state === 'action_reported' && actionHref ? (
        <Link href={actionHref} asChild>
          <Pressable
            role="link"
            accessibilityLabel={`Review corrective action on finding ${f.number}`}
            style={styles.actionLink}
          >
            <Text variant="heading" color={colors.accent}>
              Review corrective action
            </Text>
            <Feather name="chevron-right" size={18} color={colors.accent} />
          </Pressable>
        </Link>
      ) : null}
      {confirming && editable && !f.saving ? (
        <View style={styles.confirm} role="alert">
          <Text variant="heading">Delete finding {f.number}?</Text>
          <Text variant="small" muted>
            It is removed from the inspection; the audit trail keeps a record of it.
          </Text>
          <View style={styles.confirmButtons}>
            <Button
              label="Delete"
              tone="danger"
              accessibilityLabel={`Confirm deleting finding ${f.number}`}
              onPress={() => {
                onConfirming(false);
                onDelete(f);
              }}
            />
            <Button label="Keep it" tone="quiet" onPress={() => onConfirming(false)} />
          </View>
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  saving: { borderStyle: 'dashed', borderColor: colors.focus },
  editing: {
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 2,
    borderColor: colors.base,
    backgroundColor: colors.surface,
  },
  head: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  number: { minWidth: 24 },
  spacer: { flexGrow: 1 },
  actions: { flexDirection: 'row', gap: space.xs },
  confirm: {
    marginTop: space.xs,
    padding: space.md,
    gap: space.sm,
    borderRadius: radius.sm,
    backgroundColor: colors.overSoft,
  },
  confirmButtons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  actionLink: {
    flexDirection: 'row',
    alignItems: 'center',
    alignSelf: 'flex-start',
    gap: space.xs,
    minHeight: layout.touchTarget,
  },
});
