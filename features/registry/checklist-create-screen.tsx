import { router, useLocalSearchParams } from 'expo-router';
import { StyleSheet } from 'react-native';

import { Card } from '@/components/card';
import { SubScreen } from '@/components/sub-screen';
import { RoleGate } from '@/features/auth/ui';
import { useChecklistSaveMutation } from '@/features/registry/api';
import { ChecklistForm } from '@/features/registry/checklist-form';
import { checklistHref, checklistsHref } from '@/features/registry/hrefs';
import { editors, routeParam } from '@/features/registry/screen-access';
import { type RideClass, rideClassLabel, rideClassSchema } from '@/features/rides/schema';

/** A new template for a ride class, starting with one empty area and item. */
export function ChecklistCreateScreen() {
  const { rideClass } = useLocalSearchParams<{ rideClass?: string }>();
  const parsed = rideClassSchema.safeParse(routeParam(rideClass));
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
            inspectionType: 'general',
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
  formCard: { maxWidth: 980, width: '100%' },
});
