import { Link, router, useLocalSearchParams } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Panes } from '@/components/panes';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { useChecklistQuery, useChecklistVersionsQuery } from '@/features/registry/api';
import { measurementKindLabel } from '@/features/registry/checklist-form';
import { limitWords } from '@/features/registry/checklist-limit-field';
import { DeleteAction } from '@/features/registry/delete-action';
import {
  checklistEditHref,
  checklistHref,
  checklistVersionHref,
  checklistsHref,
} from '@/features/registry/hrefs';
import { canEditRides } from '@/features/registry/ride-route';
import { type ChecklistTemplate, templateTypeWords } from '@/features/registry/schema';
import { routeParam, staff } from '@/features/registry/screen-access';
import { rideClassLabel } from '@/features/rides/schema';
import type { Role } from '@/features/session/schema';
import { useUnitSystem } from '@/features/settings';
import { ApiRequestError } from '@/lib/api-errors';
import { formatDateTime } from '@/lib/dates';

/** One template: its areas and items, with the photo and measurement flags; editors make a new version. */
export function ChecklistScreen() {
  const { id, version } = useLocalSearchParams<{ id: string; version?: string }>();
  const n = version ? Number(routeParam(version)) : undefined;
  return (
    <RoleGate roles={staff}>
      {(user) => <ChecklistView id={routeParam(id)} version={n} role={user.role} />}
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
              {canEditRides(role) && isCurrent && !t.archivedAt ? (
                <DeleteAction
                  kind="checklist"
                  id={t.id}
                  noun="template"
                  name={t.name}
                  verb="Archive"
                  consequence={
                    'New inspections stop using this template. Its versions stay readable, and inspections ' +
                    'already made with it keep it. The audit log keeps a record.'
                  }
                  listHref={checklistsHref}
                />
              ) : null}
            </Card>
            <Card>
              <Text variant="heading">Versions</Text>
              {versions.isPending ? (
                <Spinner color={colors.base} />
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
            subtitle={`${rideClassLabel[t.rideClass]} · ${templateTypeWords(t.inspectionType)} · ${t.version.content.areas.length} areas · ${t.version.content.areas.reduce((n, a) => n + a.items.length, 0)} items`}
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

const styles = StyleSheet.create({
  flex: { flex: 1, minWidth: 0, gap: 2 },
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
});
