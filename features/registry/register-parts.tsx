import { type Href } from 'expo-router';

import { Card } from '@/components/card';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { RideCard } from '@/features/rides/ui';
import type { RideSummary } from '@/features/rides/schema';

export const PAGE_SIZE = 25;

export function NotFound({ title, back }: { title: string; back: { href: Href; label: string } }) {
  return (
    <SubScreen title={title} back={back}>
      <Card role="alert">
        <Text>It may have been removed, or the link is old.</Text>
      </Card>
    </SubScreen>
  );
}

/** The rides of a company or site under their count; the count waits for the list. */
export function RidesPane({
  title,
  page,
}: {
  title: string;
  page: { total: number; rides: RideSummary[] } | undefined;
}) {
  return (
    <>
      <Text variant="label" muted>
        {`${title} (${page?.total ?? '…'})`}
      </Text>
      {(page?.rides ?? []).map((r) => (
        <RideCard key={r.id} ride={r} showOperator={false} link />
      ))}
    </>
  );
}
