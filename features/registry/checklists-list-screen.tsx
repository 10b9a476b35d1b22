import { router } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { LinkCard } from '@/components/link-card';
import Feather from '@/components/feather-icon';
import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { ToggleChips } from '@/components/toggle-chips';
import { useListParams } from '@/components/use-list-params';
import { RoleGate } from '@/features/auth/ui';
import { useChecklistListQuery } from '@/features/registry/api';
import { checklistHref, newChecklistHref } from '@/features/registry/hrefs';
import { RegisterTabs } from '@/features/registry/register-tabs';
import { RemovalNotice } from '@/features/registry/removal-notice';
import { canEditRides } from '@/features/registry/ride-route';
import { type ChecklistTemplateSummary, templateTypeWords } from '@/features/registry/schema';
import { staff } from '@/features/registry/screen-access';
import { type RideClass, rideClassLabel, rideClassSchema, rideClasses } from '@/features/rides/schema';
import type { SessionUser } from '@/features/session/schema';
import { formatDateTime } from '@/lib/dates';

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
    <Screen
      title="Checklists"
      subtitle="Checklist templates per ride class. Each change makes a new version."
    >
      <RegisterTabs role={user.role} />
      <RemovalNotice />
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
    <LinkCard
      href={checklistHref(t.id)}
      label={`${t.name}, version ${t.currentVersion}`}
      title={<Text variant="heading">{t.name}</Text>}
      plain
      style={styles.row}
    >
      {(name) => (
        <>
          <View style={styles.flex}>
            {name}
            <Text variant="small" muted>
              {templateTypeWords(t.inspectionType)} · {t.areaCount} areas · {t.itemCount} items · v
              {t.currentVersion}, {formatDateTime(t.updatedAt)} by {t.updatedByName}
            </Text>
          </View>
          <Feather name="chevron-right" size={20} color={colors.accent} />
        </>
      )}
    </LinkCard>
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
});
