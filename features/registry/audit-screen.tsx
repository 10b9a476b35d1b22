import { router } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { DateField } from '@/components/date-field';
import Feather from '@/components/feather-icon';
import { Screen } from '@/components/screen';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { ToggleChips } from '@/components/toggle-chips';
import { colors, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import type { SessionUser } from '@/features/session/schema';
import { useAuditQuery } from '@/features/registry/api';
import { entryChanges } from '@/features/registry/audit-diff';
import { EffectBadge } from '@/features/registry/design-comparison';
import { FilterGroup, FilterGroups, FilterPanel } from '@/components/filter-panel';
import { PagedList } from '@/components/paged-list';
import { RegisterTabs } from '@/features/registry/register-tabs';
import {
  type AuditAction,
  type AuditEntity,
  type AuditEntry,
  auditActions,
  auditEntities,
  auditListQuerySchema,
} from '@/features/registry/schema';
import { deviceTimeZone, formatDateTime, zoneLabel } from '@/lib/dates';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { rideHref } from '@/features/rides';
import { useUnitSystem } from '@/features/settings';

const PAGE_SIZE = 30;
const LIST_KEYS = ['entity', 'action', 'rideId', 'from', 'to', 'q', 'sort', 'page'] as const;

export const auditEntityLabel: Record<AuditEntity, string> = {
  company: 'Company',
  site: 'Site',
  ride: 'Ride',
  design: 'Design data',
  checklist_template: 'Checklist',
  schedule: 'Schedule',
  inspection: 'Inspection',
  finding: 'Finding',
  notice: 'Notice',
  corrective_action: 'Corrective action',
  instrument: 'Instrument',
  setting: 'Setting',
  user: 'Person',
  incident: 'Incident report',
  bulletin: 'Maker bulletin',
  bulletin_action: 'Bulletin done / not done',
  setup: 'Set-up',
  site_event: 'Event',
  round: 'Round',
};

const actionSpec: Record<
  AuditAction,
  {
    label: string;
    icon:
      | 'plus-circle'
      | 'edit-3'
      | 'trash-2'
      | 'mail'
      | 'key'
      | 'lock'
      | 'unlock'
      | 'log-out'
      | 'alert-triangle';
    color: string;
  }
> = {
  create: { label: 'Added', icon: 'plus-circle', color: colors.within },
  update: { label: 'Changed', icon: 'edit-3', color: colors.text },
  delete: { label: 'Removed', icon: 'trash-2', color: colors.over },
  invite: { label: 'Invited', icon: 'mail', color: colors.text },
  password_set: { label: 'Password set', icon: 'key', color: colors.text },
  password_change: { label: 'Password changed', icon: 'key', color: colors.text },
  password_reset: { label: 'Password reset', icon: 'key', color: colors.text },
  disable: { label: 'Disabled', icon: 'lock', color: colors.over },
  enable: { label: 'Re-enabled', icon: 'unlock', color: colors.within },
  sign_out: { label: 'Signed out', icon: 'log-out', color: colors.text },
  sign_in_failed: { label: 'Failed sign-in', icon: 'alert-triangle', color: colors.over },
};

/** Who changed what in the register, design data, templates and schedules, and when. */
export function AuditScreen() {
  return <RoleGate roles={['admin', 'supervisor']}>{(user) => <Audit user={user} />}</RoleGate>;
}

function Audit({ user }: { user: SessionUser }) {
  const wide = useWide();
  const [query, setQuery] = useListParams(auditListQuerySchema, LIST_KEYS);
  // The URL keeps what was typed for the dates; the parsed query holds ISO instants.
  const entries = useAuditQuery({ ...query, pageSize: PAGE_SIZE });
  const [search, setSearch] = useSearchText(query.q, (q) => setQuery({ q, page: undefined }));
  const from = query.from?.slice(0, 10) ?? null;
  const to = query.to?.slice(0, 10) ?? null;
  const filter = (patch: Parameters<typeof setQuery>[0]) => setQuery({ ...patch, page: undefined });

  return (
    <Screen
      title="Audit log"
      subtitle={`Every change to the register, with who made it and when (times in ${zoneLabel(new Date(), deviceTimeZone())}).`}
    >
      <RegisterTabs role={user.role} />
      <FilterPanel
        active={
          (query.entity?.length ?? 0) +
          (query.action?.length ?? 0) +
          (query.from ? 1 : 0) +
          (query.to ? 1 : 0)
        }
        search={
          <TextField label="Search the log" value={search} onChangeText={setSearch} autoCapitalize="none" />
        }
        beside={
          <>
            <View style={wide ? styles.flex : undefined}>
              <DateField
                label="From"
                value={from}
                max={to ?? undefined}
                onChange={(day) => filter({ from: day ?? undefined })}
              />
            </View>
            <View style={wide ? styles.flex : undefined}>
              <DateField
                label="To"
                value={to}
                min={from ?? undefined}
                onChange={(day) => filter({ to: day ?? undefined })}
              />
            </View>
          </>
        }
        filters={
          <FilterGroups>
            <FilterGroup label="What">
              <ToggleChips
                label="What"
                values={query.entity ?? []}
                options={auditEntities.map((e) => ({ value: e, label: auditEntityLabel[e] }))}
                onChange={(v) => filter({ entity: v })}
              />
            </FilterGroup>
            <FilterGroup label="Change">
              <ToggleChips
                label="Change"
                values={query.action ?? []}
                options={auditActions.map((a) => ({ value: a, label: actionSpec[a].label }))}
                onChange={(v) => filter({ action: v })}
              />
            </FilterGroup>
            <FilterGroup label="Order">
              <Segmented
                label="Order"
                value={query.sort === 'at' ? 'oldest' : 'newest'}
                options={[
                  { value: 'newest', label: 'Newest first' },
                  { value: 'oldest', label: 'Oldest first' },
                ]}
                onChange={(v) => filter({ sort: v === 'oldest' ? 'at' : undefined })}
              />
            </FilterGroup>
          </FilterGroups>
        }
      />
      {query.rideId ? (
        <Card style={styles.rideFilter}>
          <Text variant="small">Only the changes to one ride.</Text>
          <Button label="Show all" tone="quiet" onPress={() => filter({ rideId: undefined })} />
        </Card>
      ) : null}
      <PagedList query={entries} noun="entries" setPage={(page) => setQuery({ page })}>
        {(page) =>
          page.entries.length === 0 ? (
            <Card>
              <Text variant="heading">No changes match.</Text>
            </Card>
          ) : (
            <View style={styles.log} accessibilityLabel="Audit entries">
              {page.entries.map((e) => (
                <AuditRow key={e.id} entry={e} wide={wide} />
              ))}
            </View>
          )
        }
      </PagedList>
    </Screen>
  );
}

function AuditRow({ entry: e, wide }: { entry: AuditEntry; wide: boolean }) {
  const [open, setOpen] = useState(false);
  const [system] = useUnitSystem();
  const spec = actionSpec[e.action];
  // Design data reads in words and units ("Max clearance at Main pivot: 0.4 mm → 0.6 mm"), not stored keys.
  const changes = open ? entryChanges(e.entity, e.before, e.after, system) : [];
  return (
    <View style={styles.entry}>
      <Pressable
        role="button"
        // Named by its words as shown (when, what, who: WCAG 2.5.3); aria-expanded says whether the
        // changes are open.
        aria-expanded={open}
        onPress={() => setOpen((o) => !o)}
        style={wide ? styles.entryRowWide : styles.entryRow}
      >
        <Text variant="figure" style={wide ? styles.when : undefined}>
          {formatDateTime(e.at)}
        </Text>
        <View style={styles.action}>
          <Feather name={spec.icon} size={16} color={spec.color} />
          <Text variant="label" color={spec.color}>
            {spec.label}
          </Text>
          <Text variant="label" muted>
            {auditEntityLabel[e.entity]}
          </Text>
        </View>
        <Text style={wide ? styles.flex : undefined}>{e.summary}</Text>
        <Text variant="small" muted style={wide ? styles.who : undefined}>
          {e.userName ?? 'Unknown'}
        </Text>
        <Feather name={open ? 'chevron-up' : 'chevron-down'} size={18} color={colors.textMuted} />
      </Pressable>
      {open ? (
        <View style={styles.detail}>
          {changes.length === 0 ? <Text muted>No field-level difference recorded.</Text> : null}
          {changes.map((c, i) => (
            <View
              key={`${c.field}|${i}`}
              accessible
              accessibilityLabel={`${c.field}: ${c.before ?? '—'} → ${c.after ?? (c.before !== null ? 'removed' : '—')}${c.effect && c.effect !== 'changed' ? ` (${c.effect})` : ''}`}
              style={[
                wide ? styles.changeWide : styles.change,
                c.effect === 'loosened' ? styles.loosened : null,
              ]}
            >
              <Text variant="label" style={wide ? styles.field : undefined}>
                {c.field}
              </Text>
              {c.before !== null ? (
                <Text variant="small" style={wide ? styles.flex : undefined}>
                  <Text variant="small" muted>
                    was{' '}
                  </Text>
                  {c.before}
                </Text>
              ) : null}
              {c.after !== null ? (
                <Text variant="small" style={wide ? styles.flex : undefined}>
                  <Text variant="small" muted>
                    now{' '}
                  </Text>
                  {c.after}
                </Text>
              ) : e.entity === 'design' && c.before !== null ? (
                <Text variant="small" style={wide ? styles.flex : undefined}>
                  <Text variant="small" muted>
                    now{' '}
                  </Text>
                  removed
                </Text>
              ) : null}
              {c.effect && c.effect !== 'changed' ? <EffectBadge effect={c.effect} /> : null}
            </View>
          ))}
          {e.rideId && e.action !== 'delete' ? (
            <Button
              label="Open the ride"
              tone="quiet"
              onPress={() => router.push(rideHref(e.rideId ?? ''))}
              style={styles.start}
            />
          ) : null}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1, minWidth: 0 },
  start: { alignSelf: 'flex-start' },
  rideFilter: { flexDirection: 'row', alignItems: 'center', gap: space.md, flexWrap: 'wrap' },
  log: {
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    overflow: 'hidden',
  },
  entry: { borderBottomWidth: 1, borderBottomColor: colors.surfaceSunk },
  entryRow: { padding: space.md, gap: space.xs, minHeight: 48 },
  entryRowWide: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    minHeight: 52,
  },
  when: { width: 170 },
  who: { width: 140 },
  action: { flexDirection: 'row', alignItems: 'center', gap: space.xs, minWidth: 190 },
  detail: { backgroundColor: colors.bg, padding: space.md, gap: space.sm },
  change: { gap: 2 },
  changeWide: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  field: { width: 260 },
  loosened: { backgroundColor: colors.overSoft, paddingVertical: space.xs, borderRadius: radius.sm },
});
