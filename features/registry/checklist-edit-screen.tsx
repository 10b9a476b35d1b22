import { router, useLocalSearchParams } from 'expo-router';
import { StyleSheet } from 'react-native';

import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { RoleGate } from '@/features/auth/ui';
import { useChecklistQuery, useChecklistSaveMutation } from '@/features/registry/api';
import { ChecklistForm, contentToForm } from '@/features/registry/checklist-form';
import { checklistHref } from '@/features/registry/hrefs';
import { editors, routeParam } from '@/features/registry/screen-access';

/** Editing makes a new version; the version it started from is sent so a concurrent edit is refused. */
export function ChecklistEditScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  return <RoleGate roles={editors}>{() => <ChecklistEdit id={routeParam(id)} />}</RoleGate>;
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
              defaultValues={{
                name: t.name,
                inspectionType: t.inspectionType ?? 'general',
                content: contentToForm(t.version.content),
                reason: '',
              }}
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

const styles = StyleSheet.create({
  formCard: { maxWidth: 980, width: '100%' },
});
