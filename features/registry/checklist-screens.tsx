import Feather from '@expo/vector-icons/Feather';
import { Link, router, useLocalSearchParams } from 'expo-router';
import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { ToggleChips } from '@/components/toggle-chips';
import { colors, layout, radius, space } from '@/components/theme';
import { ApiRequestError } from '@/lib/api-errors';
import { RoleGate } from '@/features/auth';
import type { Role, SessionUser } from '@/features/session/schema';
import {
  useChecklistListQuery,
  useChecklistQuery,
  useChecklistSaveMutation,
  useChecklistVersionsQuery,
} from '@/features/registry/api';
import { ChecklistForm, contentToForm, measurementKindLabel } from '@/features/registry/checklist-form';
import { limitWords } from '@/features/registry/checklist-limit-field';
import { Panes } from '@/components/panes';
import { RegisterTabs } from '@/features/registry/register-tabs';
import { canEditRides } from '@/features/registry/ride-route';
import type { ChecklistTemplate, ChecklistTemplateSummary } from '@/features/registry/schema';
import { useUnitSystem } from '@/features/settings';
import { formatDateTime } from '@/lib/dates';
import { useListParams } from '@/components/use-list-params';
import {
  checklistEditHref,
  checklistHref,
  checklistVersionHref,
  checklistsHref,
  newChecklistHref,
} from '@/features/registry/hrefs';
import { type RideClass, rideClassLabel, rideClassSchema, rideClasses } from '@/features/rides/schema';
import { z } from 'zod';

const staff = ['admin', 'supervisor', 'inspector'] as const;
const editors = ['admin', 'supervisor'] as const;

const paramString = (v: string | string[] | undefined) => (Array.isArray(v) ? (v[0] ?? '') : (v ?? ''));

const classFilterSchema = z.object({
  rideClass: z
    .string()
    .optional()
    .transform((v) =>
      v ? v.split(',').filter((c): c is RideClass => rideClassSchema.safeParse(c).success) : [],
    ),
});

/** Checklist templates by ride class: what each inspection walks through. */
export function ChecklistsListScreen() {
  return <RoleGate roles={staff}>{(user) => <ChecklistsList user={user} />}</RoleGate>;
}

function ChecklistsList({ user }: { user: SessionUser }) {
  const [query, setQuery] = useListParams(classFilterSchema, ['rideClass']);
  const templates = useChecklistListQuery();
  const shown = query.rideClass.length ? query.rideClass : [...rideClasses];
  return (
    <Screen title="Rides" subtitle="Checklist templates per ride class. Each change makes a new version.">
      <RegisterTabs role={user.role} />
      <Card>
        <Text variant="label" muted>
          RIDE CLASS
        </Text>
        <ToggleChips
          label="Ride class"
          values={query.rideClass}
          options={rideClasses.map((c) => ({ value: c, label: rideClassLabel[c] }))}
          onChange={(v) => setQuery({ rideClass: v })}
        />
      </Card>
      <QueryState query={templates}>
        {(list) => (
          <View style={styles.list}>
            {shown.map((rideClass) => {
              const mine = list.filter((t) => t.rideClass === rideClass);
              return (
                <View key={rideClass} style={styles.list}>
                  <SectionTitle>{rideClassLabel[rideClass]}</SectionTitle>
                  {mine.length === 0 ? (
                    <Text muted>No template for this class yet.</Text>
                  ) : (
                    mine.map((t) => <TemplateRow key={t.id} template={t} />)
                  )}
                  {canEditRides(user.role) ? (
                    <Button
                      label={`New template for ${rideClassLabel[rideClass].toLowerCase()}`}
                      tone="quiet"
                      icon={<Feather name="plus" size={18} color={colors.text} />}
                      onPress={() => router.push(newChecklistHref(rideClass))}
                      style={styles.start}
                    />
                  ) : null}
                </View>
              );
            })}
          </View>
        )}
      </QueryState>
    </Screen>
  );
}

function TemplateRow({ template: t }: { template: ChecklistTemplateSummary }) {
  return (
    <Link href={checklistHref(t.id)} asChild>
      <Pressable role="link" accessibilityLabel={`${t.name}, version ${t.currentVersion}`} style={styles.row}>
        <View style={styles.flex}>
          <Text variant="heading">{t.name}</Text>
          <Text variant="small" muted>
            {t.areaCount} areas · {t.itemCount} items · v{t.currentVersion}, {formatDateTime(t.updatedAt)} by{' '}
            {t.updatedByName}
          </Text>
        </View>
        <Feather name="chevron-right" size={20} color={colors.accent} />
      </Pressable>
    </Link>
  );
}

/** One template: its areas and items, with the photo and measurement flags; editors make a new version. */
export function ChecklistScreen() {
  const { id, version } = useLocalSearchParams<{ id: string; version?: string }>();
  const n = version ? Number(paramString(version)) : undefined;
  return (
    <RoleGate roles={staff}>
      {(user) => <ChecklistView id={paramString(id)} version={n} role={user.role} />}
    </RoleGate>
  );
}

function ChecklistView({ id, version, role }: { id: string; version?: number; role: Role }) {
  const template = useChecklistQuery(id, version);
  const current = useChecklistQuery(id);
  const versions = useChecklistVersionsQuery(id);
  if (template.error instanceof ApiRequestError && template.error.status === 404)
    return (
      <SubScreen title="Template not found" back={{ href: checklistsHref, label: 'Checklists' }}>
        <Card role="alert">
          <Text>There is no such checklist template (or version).</Text>
        </Card>
      </SubScreen>
    );
  return (
    <QueryState query={template}>
      {(t) => {
        const currentVersion = current.data?.version.version ?? t.currentVersion;
        const isCurrent = t.version.version === currentVersion;
        const side = (
          <>
            <Card>
              <Text variant="heading">
                Version {t.version.version}
                {isCurrent ? ' · current' : ''}
              </Text>
              {!isCurrent ? (
                <Text variant="small" color={colors.near}>
                  An earlier version, shown as it was. Version {currentVersion} is current.
                </Text>
              ) : null}
              <Text variant="small" muted>
                {formatDateTime(t.version.createdAt)} by {t.version.createdByName}
              </Text>
              <Text>{t.version.reason}</Text>
              {t.archivedAt ? (
                <Text variant="small" color={colors.near}>
                  Archived {formatDateTime(t.archivedAt)}: no longer used for new inspections.
                </Text>
              ) : null}
              {canEditRides(role) && isCurrent && !t.archivedAt ? (
                <Button
                  label="Edit (makes a new version)"
                  tone="accent"
                  onPress={() => router.push(checklistEditHref(t.id))}
                />
              ) : null}
            </Card>
            <Card>
              <Text variant="heading">Versions</Text>
              {versions.isPending ? (
                <ActivityIndicator color={colors.base} />
              ) : (
                (versions.data ?? []).map((v) => (
                  <Link
                    key={v.version}
                    href={
                      v.version === currentVersion
                        ? checklistHref(t.id)
                        : checklistVersionHref(t.id, v.version)
                    }
                    asChild
                  >
                    <Pressable
                      role="link"
                      style={v.version === t.version.version ? styles.versionShown : styles.version}
                    >
                      <Text variant="heading">
                        v{v.version}
                        {v.version === currentVersion ? ' · current' : ''}
                      </Text>
                      <Text variant="small" numberOfLines={2}>
                        {v.reason}
                      </Text>
                      <Text variant="small" muted>
                        {formatDateTime(v.createdAt)} · {v.createdByName}
                      </Text>
                    </Pressable>
                  </Link>
                ))
              )}
            </Card>
          </>
        );
        return (
          <SubScreen
            title={t.name}
            subtitle={`${rideClassLabel[t.rideClass]} · ${t.version.content.areas.length} areas · ${t.version.content.areas.reduce((n, a) => n + a.items.length, 0)} items`}
            back={
              isCurrent
                ? { href: checklistsHref, label: 'Checklists' }
                : { href: checklistHref(t.id), label: 'Current version' }
            }
          >
            <Panes main={<ChecklistContentView template={t} />} side={side} />
          </SubScreen>
        );
      }}
    </QueryState>
  );
}

function ChecklistContentView({ template }: { template: ChecklistTemplate }) {
  const [system] = useUnitSystem();
  return (
    <>
      {template.version.content.areas.map((area, a) => (
        <Card key={area.id} accessibilityLabel={area.title}>
          <Text variant="heading">
            {a + 1}. {area.title}
          </Text>
          {area.items.map((item, i) => (
            <View key={item.id} style={styles.item}>
              <Text variant="figure" muted style={styles.itemNo}>
                {a + 1}.{i + 1}
              </Text>
              <View style={styles.flex}>
                <Text>{item.text}</Text>
                {item.guidance ? (
                  <Text variant="small" muted>
                    {item.guidance}
                  </Text>
                ) : null}
                <View style={styles.flags}>
                  {item.photoRequired ? <Flag icon="camera" label="Photo required" /> : null}
                  {item.measurementRequired ? (
                    <Flag
                      icon="crosshair"
                      label={`Measure: ${item.measurementLabel ?? (item.measurementKind ? measurementKindLabel[item.measurementKind] : 'reading')}`}
                    />
                  ) : null}
                  {limitWords(item.limit, item.measurementKind, system) ? (
                    <Flag
                      icon="crosshair"
                      label={`Limit: ${limitWords(item.limit, item.measurementKind, system)}`}
                    />
                  ) : null}
                </View>
              </View>
            </View>
          ))}
        </Card>
      ))}
    </>
  );
}

function Flag({ icon, label }: { icon: 'camera' | 'crosshair'; label: string }) {
  return (
    <View style={styles.flag}>
      <Feather name={icon} size={14} color={colors.base} />
      <Text variant="label" color={colors.base}>
        {label}
      </Text>
    </View>
  );
}

/** Editing makes a new version; the version it started from is sent so a concurrent edit is refused. */
export function ChecklistEditScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <RoleGate roles={editors}>{() => <ChecklistEdit id={paramString(id)} />}</RoleGate>;
}

function ChecklistEdit({ id }: { id: string }) {
  const template = useChecklistQuery(id);
  const save = useChecklistSaveMutation(id);
  return (
    <QueryState query={template}>
      {(t) => (
        <SubScreen
          title={`Edit ${t.name}`}
          subtitle={`Saving makes version ${t.version.version + 1}. Items keep their identity across versions.`}
          back={{ href: checklistHref(t.id), label: t.name }}
        >
          <Card style={styles.formCard}>
            <ChecklistForm
              defaultValues={{ name: t.name, content: contentToForm(t.version.content), reason: '' }}
              submitLabel={`Save as version ${t.version.version + 1}`}
              onSubmit={async (values) => {
                await save.mutateAsync({
                  ...values,
                  rideClass: t.rideClass,
                  basedOnVersion: t.version.version,
                });
                router.replace(checklistHref(t.id));
              }}
              onCancel={() => router.back()}
            />
          </Card>
        </SubScreen>
      )}
    </QueryState>
  );
}

/** A new template for a ride class, starting with one empty area and item. */
export function ChecklistCreateScreen() {
  const { rideClass } = useLocalSearchParams<{ rideClass?: string }>();
  const parsed = rideClassSchema.safeParse(paramString(rideClass));
  const cls: RideClass = parsed.success ? parsed.data : 'other';
  return <RoleGate roles={editors}>{() => <ChecklistCreate rideClass={cls} />}</RoleGate>;
}

function ChecklistCreate({ rideClass }: { rideClass: RideClass }) {
  const save = useChecklistSaveMutation(null);
  return (
    <SubScreen
      title="New checklist template"
      subtitle={rideClassLabel[rideClass]}
      back={{ href: checklistsHref, label: 'Checklists' }}
    >
      <Card style={styles.formCard}>
        <ChecklistForm
          defaultValues={{
            name: '',
            reason: '',
            content: {
              areas: [
                {
                  title: '',
                  items: [
                    {
                      text: '',
                      guidance: '',
                      photoRequired: false,
                      measurementRequired: false,
                      measurementKind: null,
                      measurementLabel: '',
                    },
                  ],
                },
              ],
            },
          }}
          submitLabel="Create template"
          onSubmit={async (values) => {
            const { template } = await save.mutateAsync({ ...values, rideClass });
            router.replace(checklistHref(template.id));
          }}
          onCancel={() => router.back()}
        />
      </Card>
    </SubScreen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  flex: { flex: 1, minWidth: 0, gap: 2 },
  start: { alignSelf: 'flex-start' },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.touchTarget,
    padding: space.lg,
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
  },
  item: {
    flexDirection: 'row',
    gap: space.md,
    paddingVertical: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  itemNo: { width: 44 },
  flags: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, marginTop: 2 },
  flag: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    borderRadius: radius.sm,
    backgroundColor: colors.surfaceSunk,
  },
  version: {
    minHeight: layout.touchTarget,
    paddingVertical: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
    gap: 2,
  },
  versionShown: {
    minHeight: layout.touchTarget,
    paddingVertical: space.sm,
    paddingHorizontal: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
    gap: 2,
    backgroundColor: colors.accentSoft,
    borderLeftWidth: 3,
    borderLeftColor: colors.accent,
  },
  formCard: { maxWidth: 980, width: '100%' },
});
