import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { Card } from '@/components/card';
import { CheckField } from '@/components/check-field';
import { SettingFooter } from '@/components/setting-footer';
import { Text } from '@/components/text';
import { apiFetch } from '@/features/api';
import { reviewKeys } from '@/features/review/keys';
import { selfApprovalResponseSchema } from '@/features/review/schema';
import { formatDateTime } from '@/lib/dates';

const PATH = '/api/settings/self-approval';

/**
 * The administrator's switch for approving one's own inspections. Off by default (a second person approves
 * every inspection); the server enforces it, and the desk shows a supervisor why Approve is missing.
 */
export function SelfApprovalCard() {
  const client = useQueryClient();
  const key = reviewKeys.selfApproval();
  const setting = useQuery({
    queryKey: key,
    queryFn: () => apiFetch(PATH, { schema: selfApprovalResponseSchema }),
  });
  const save = useMutation({
    mutationFn: (allowed: boolean) =>
      apiFetch(PATH, { method: 'PUT', body: { allowed }, schema: selfApprovalResponseSchema }),
    onSuccess: async (data) => {
      client.setQueryData(key, data);
      // Open inspections carry the server's refusal reason, which this changes.
      await client.invalidateQueries({ queryKey: reviewKeys.all });
    },
  });
  const current = setting.data?.selfApproval;
  return (
    <Card accessibilityLabel="Approving one’s own inspections">
      <Text variant="heading">Approving one’s own inspections</Text>
      <Text variant="small" muted>
        Off: a supervisor who recorded an inspection cannot approve it; another supervisor or an administrator
        does. Returning it is always possible.
      </Text>
      {current ? (
        <CheckField
          label="Supervisors may approve inspections they recorded"
          value={current.allowed}
          onChange={(allowed) => save.mutate(allowed)}
        />
      ) : null}
      <SettingFooter
        changedAt={current?.updatedAt ? formatDateTime(current.updatedAt) : null}
        changedBy={current?.updatedByName}
        error={save.error ?? setting.error}
      />
    </Card>
  );
}
