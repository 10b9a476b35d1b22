import { StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import type { EnvelopeItem, LoadCaseKind } from '@/features/loads/engine';
import { LoadCasesTable } from '@/features/loads/ui';
import {
  type JointModel,
  PERIOD_DIFFERENCE_WARNING,
  type PeriodCheck,
  type StoredLoadCase,
  jointModelText,
  modelsNotRecorded,
  periodCheckText,
  periodDiffers,
} from '@/features/records/analysis-schema';
import type { UnitSystem } from '@/lib/units';

type Props = {
  /** Absent from analyses made before models were recorded. */
  models?: readonly JointModel[];
  periodChecks?: readonly PeriodCheck[];
  /** Shown as a table unless the result view already shows them. */
  loadCases?: readonly Pick<StoredLoadCase, 'kind' | 'label' | 'joints' | 'status'>[];
  governingCase?: LoadCaseKind | null;
  /** The merged envelope, to name what makes the governing case govern. */
  envelope?: readonly Pick<EnvelopeItem, 'label' | 'ratio'>[];
  engineVersion: string;
  system: UnitSystem;
};

/**
 * How a load check was made: the model each joint ran and where its motion came from, a free swing's
 * computed period against the measured one, and the load cases with the governing one. Analyses made
 * before this was recorded say so instead of guessing.
 */
export function LoadCheckBasis({
  models,
  periodChecks,
  loadCases,
  governingCase,
  envelope,
  engineVersion,
  system,
}: Props) {
  return (
    <View style={styles.root} accessibilityLabel="How the load check was made">
      <Text variant="label" muted>
        MODEL PER JOINT
      </Text>
      {models?.length ? (
        models.map((m) => (
          <Text key={m.joint}>
            P{m.joint + 1} · {m.name}: {jointModelText(m)}
          </Text>
        ))
      ) : (
        <Text muted>{modelsNotRecorded(engineVersion)}</Text>
      )}
      {periodChecks?.length ? <PeriodChecks checks={periodChecks} /> : null}
      {loadCases && loadCases.length > 1 ? (
        <View style={styles.block}>
          <Text variant="label" muted>
            LOAD CASES
          </Text>
          <LoadCasesTable
            cases={loadCases}
            governing={governingCase ?? null}
            envelope={envelope}
            system={system}
          />
        </View>
      ) : null}
    </View>
  );
}

function PeriodChecks({ checks }: { checks: readonly PeriodCheck[] }) {
  const share = `${(PERIOD_DIFFERENCE_WARNING * 100).toFixed(0)} %`;
  return (
    <View style={styles.block} accessibilityLabel="Free swing period, computed and measured">
      <Text variant="label" muted>
        FREE SWING PERIOD
      </Text>
      {checks.map((p) => {
        const differs = periodDiffers(p);
        return (
          <View key={p.joint} style={styles.line}>
            <Feather
              name={differs ? 'alert-triangle' : 'check'}
              size={16}
              color={differs ? colors.near : colors.within}
            />
            <View style={styles.lineText}>
              <Text variant={differs ? 'heading' : 'body'} color={differs ? colors.near : undefined}>
                {p.name}: {differs ? `differs by more than ${share}` : `agrees within ${share}`}
              </Text>
              <Text variant="small">
                {periodCheckText(p)}
                {p.amplitudeFrom === 'design' ? ' (swung from the design amplitude: none was measured)' : ''}
              </Text>
              {differs ? (
                <Text variant="small" muted>
                  A dragging bearing, a drive fault or wrong design data show up here.
                </Text>
              ) : null}
            </View>
          </View>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.xs },
  block: { gap: space.xs, marginTop: space.sm },
  line: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm },
  lineText: { flex: 1, gap: 2 },
});
