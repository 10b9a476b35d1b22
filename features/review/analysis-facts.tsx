import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { formatValue } from '@/features/loads';
import { formatDateTime } from '@/lib/dates';
import type { InspectionDetail } from '@/features/review/inspection-schema';
import { rideVersionHref } from '@/features/rides';

/**
 * What the result rests on: the engine and design-data versions the server used, when, and where the
 * phone's own preview (shown to the inspector on site) differed from it.
 */
export function AnalysisFacts({ inspection }: { inspection: InspectionDetail }) {
  const a = inspection.analysis;
  const versionHref = a ? rideVersionHref(inspection.rideId, a.designVersion) : null;
  return (
    <Card accessibilityLabel="Analysis facts">
      <Text variant="heading">What the analysis used</Text>
      {a ? (
        <>
          <Fact label="Engine (server)" value={a.engineVersion} />
          <Fact label="Engine (phone)" value={a.device?.engineVersion ?? 'No preview sent'} />
          <View style={styles.fact}>
            <Text variant="label" muted>
              DESIGN DATA
            </Text>
            {versionHref ? (
              <Link href={versionHref} asChild>
                <Pressable role="link" style={styles.link}>
                  <Text variant="heading" color={colors.accent}>
                    Version {a.designVersion}
                  </Text>
                  <Feather name="chevron-right" size={18} color={colors.accent} />
                </Pressable>
              </Link>
            ) : null}
          </View>
          <Fact
            label="Analysed"
            value={inspection.analysedAt ? formatDateTime(inspection.analysedAt) : '—'}
          />
          <Fact
            label="Ride cycle"
            value={`${a.samples} instants over ${formatValue(a.durationS, 'time', 'si')}`}
          />
          <Text variant="label" muted>
            PHONE’S PREVIEW AND SERVER
          </Text>
          {a.differences.length === 0 ? (
            <View style={styles.agree}>
              <Feather name="check" size={16} color={colors.within} />
              <Text>The phone’s preview agreed with the server’s analysis.</Text>
            </View>
          ) : (
            <View style={styles.differences} accessibilityLabel="Differences from the phone’s preview">
              <View style={styles.agree}>
                <Feather name="alert-triangle" size={16} color={colors.near} />
                <Text variant="heading" color={colors.near}>
                  {a.differences.length === 1 ? 'One difference' : `${a.differences.length} differences`}: the
                  server’s result is the one that counts.
                </Text>
              </View>
              {a.differences.map((d) => (
                <Text key={d}>• {d}</Text>
              ))}
            </View>
          )}
        </>
      ) : (
        <>
          <Fact
            label="Design data"
            value={inspection.designVersionId ? 'Recorded, not analysed yet' : 'None'}
          />
          <Text muted>{inspection.analysisNote ?? 'The server has not analysed this inspection yet.'}</Text>
        </>
      )}
    </Card>
  );
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.fact}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <Text variant="figure">{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  fact: { gap: 2 },
  link: { flexDirection: 'row', alignItems: 'center', gap: space.xs, minHeight: layout.touchTarget },
  agree: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm },
  differences: { gap: space.xs },
});
