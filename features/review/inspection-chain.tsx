import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Card } from '@/components/card';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import type { DesignData } from '@/features/loads/design-schema';
import { designPose } from '@/features/registry';
import { ChainDrawing, type PivotPeak } from '@/features/registry/ui';
import { useInspectionCycle } from '@/features/review/inspection-api';
import type { InspectionDetail } from '@/features/review/inspection-schema';
import type { UnitSystem } from '@/lib/units';

type Pose = 'design' | 'peak';

/**
 * The chain of the design version the inspection was checked against, with each pivot's peak force from
 * this inspection's load check; when the cycle is at hand, also at the instant the main pivot peaks.
 */
function ChainSection({
  inspection,
  data,
  system,
  version,
  hasAnalysis,
}: {
  inspection: InspectionDetail;
  data: DesignData;
  system: UnitSystem;
  version: number;
  hasAnalysis: boolean;
}) {
  const [pose, setPose] = useState<Pose>('design');
  const cycle = useInspectionCycle(inspection.id, hasAnalysis);
  const c = cycle.data;
  const angles = useMemo(() => {
    if (pose === 'peak' && c && c.joints.length > 0) {
      // The peak's index counts the full analysis's samples; a bounded answer keeps that instant.
      const peak = c.joints[0].peakForce.index;
      const k = c.sampleIndex ? c.sampleIndex.indexOf(peak) : peak;
      return c.joints.map((j) => j.angleRad[k] ?? 0);
    }
    return designPose(data);
  }, [pose, c, data]);
  const peaks: PivotPeak[] | null = inspection.analysis
    ? inspection.analysis.joints.map((j, i) => ({
        joint: i,
        forceN: j.peakForceN,
        status: inspection.analysis?.envelope.find((e) => e.id === `joints.${i}.force`)?.status ?? null,
      }))
    : null;
  return (
    <Card style={styles.chain}>
      <View style={styles.chainHead}>
        <Text variant="small" muted style={styles.chainText}>
          Design data version {version}.{' '}
          {pose === 'design'
            ? 'At the design pose. Beside each pivot: its peak force in this inspection’s load check.'
            : 'At the instant the main pivot’s force peaks in this inspection’s ride cycle.'}
        </Text>
        {c ? (
          <Segmented
            label="Pose shown"
            value={pose}
            onChange={setPose}
            options={[
              { value: 'design', label: 'Design pose' },
              { value: 'peak', label: 'At peak load' },
            ]}
          />
        ) : null}
      </View>
      <ChainDrawing data={data} pose={angles} peaks={peaks} system={system} maxHeight={380} />
    </Card>
  );
}

/** The body chain of the design version the inspection used, or why there is none to draw. */
export function ChainOrWhyNot({
  inspection,
  data,
  loading,
  version,
  system,
}: {
  inspection: InspectionDetail;
  data: DesignData | null;
  loading: boolean;
  version: number;
  system: UnitSystem;
}) {
  return data ? (
    <ChainSection
      inspection={inspection}
      data={data}
      system={system}
      version={version}
      hasAnalysis={inspection.analysis !== null}
    />
  ) : loading ? (
    <Spinner color={colors.base} />
  ) : (
    <Card>
      <Text muted>
        {version
          ? 'The design data of this inspection could not be loaded.'
          : 'This inspection has no design data, so there is no chain to draw.'}
      </Text>
    </Card>
  );
}

const styles = StyleSheet.create({
  chain: { gap: space.md },
  chainHead: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
  },
  chainText: { flexShrink: 1, flexBasis: 260, flexGrow: 1 },
});
