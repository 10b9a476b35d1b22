import { router, useLocalSearchParams } from 'expo-router';
import { StyleSheet } from 'react-native';

import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { useBulletinQuery, useBulletinSaveMutation } from '@/features/bulletins/api';
import { BulletinForm, bulletinFormValues } from '@/features/bulletins/bulletin-form';
import { bulletinHref, bulletinsHref } from '@/features/registry';

/** A new bulletin (no id) or a change to one; supervisors and admins keep the register. */
export function BulletinEditScreen() {
  const { id } = useLocalSearchParams<{ id?: string | string[] }>();
  const bulletinId = (Array.isArray(id) ? id[0] : id) || null;
  return <RoleGate roles={['admin', 'supervisor']}>{() => <BulletinEdit id={bulletinId} />}</RoleGate>;
}

function BulletinEdit({ id }: { id: string | null }) {
  const found = useBulletinQuery(id);
  const save = useBulletinSaveMutation(id);
  const submit = async (input: Parameters<typeof save.mutateAsync>[0]) => {
    const res = await save.mutateAsync(input);
    router.replace(bulletinHref(res.bulletin.id));
  };
  if (!id)
    return (
      <SubScreen title="New bulletin" back={{ href: bulletinsHref, label: 'Bulletins' }}>
        <Card style={styles.card}>
          <BulletinForm
            defaultValues={bulletinFormValues()}
            documentSha256={null}
            submitLabel="Add bulletin"
            onSubmit={submit}
            onCancel={() => router.back()}
          />
        </Card>
      </SubScreen>
    );
  return (
    <QueryState query={found}>
      {({ bulletin: b }) => (
        <SubScreen
          title={`Edit bulletin ${b.reference}`}
          back={{ href: bulletinHref(b.id), label: `Bulletin ${b.reference}` }}
        >
          <Card style={styles.card}>
            <BulletinForm
              defaultValues={bulletinFormValues(b)}
              documentSha256={b.documentSha256}
              submitLabel="Save changes"
              onSubmit={submit}
              onCancel={() => router.back()}
            />
          </Card>
        </SubScreen>
      )}
    </QueryState>
  );
}

const styles = StyleSheet.create({
  card: { maxWidth: 760, width: '100%', gap: space.lg },
});
