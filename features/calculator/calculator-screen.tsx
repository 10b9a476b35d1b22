import { useMemo, useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { Segmented } from '@/components/segmented';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import {
  type BodyRow,
  type CalculatorOutcome,
  type MotionRow,
  designBodyNames,
  exampleBodies,
  exampleMotion,
  manualRequest,
  motionRowFromDesign,
  newBody,
  newMotion,
  rideRequest,
  runCalculator,
} from '@/features/calculator/calculator-model';
import { MotionCard, NumberField } from '@/features/calculator/motion-editor';
import { CycleResults } from '@/features/loads/ui';
import { useRidesQuery } from '@/features/rides';
import { useRideQuery } from '@/features/registry/ui';
import { rideClassLabel } from '@/features/rides/schema';
import { useUnitSystem } from '@/features/settings';

type Source = 'ride' | 'manual';

/**
 * The load check calculator: a ride's design chain (or bodies typed in), a motion per joint, and the
 * engine's result over one ride cycle, computed on this device (works offline once data is loaded).
 */
export function CalculatorScreen() {
  const wide = useWide();
  const [system, setSystem] = useUnitSystem();
  const [source, setSource] = useState<Source>('ride');
  const [rideId, setRideId] = useState<string | null>(null);
  const [bodies, setBodies] = useState<BodyRow[]>(exampleBodies);
  const [manualMotion, setManualMotion] = useState<MotionRow[]>(exampleMotion);
  const [rideEdits, setRideEdits] = useState<{ key: string; rows: MotionRow[] } | null>(null);
  const [ran, setRan] = useState<{ key: string; outcome: CalculatorOutcome } | null>(null);
  const rides = useRidesQuery();
  const ride = useRideQuery(source === 'ride' ? rideId : null);
  const design = ride.data?.design?.data ?? null;
  // Edits and results belong to one ride's design version (or to the manual chain): a freshly picked ride
  // starts from its design motion and shows its design-motion result at once.
  const key = source === 'ride' ? `ride:${ride.data?.design?.id ?? 'none'}` : 'manual';
  const designRows = useMemo(
    () =>
      design
        ? design.bodies.map((_, i) => motionRowFromDesign(design.motion.find((m) => m.joint === i)))
        : [],
    [design],
  );
  const designOutcome = useMemo(
    () => (design ? runCalculator(rideRequest(design, designRows)) : null),
    [design, designRows],
  );
  const rideMotion = rideEdits?.key === key ? rideEdits.rows : designRows;
  const outcome = ran?.key === key ? ran.outcome : source === 'ride' ? designOutcome : null;
  const setOutcome = (o: CalculatorOutcome | null) => setRan(o ? { key, outcome: o } : null);

  const motion = source === 'ride' ? rideMotion : manualMotion;
  const setMotion = source === 'ride' ? (rows: MotionRow[]) => setRideEdits({ key, rows }) : setManualMotion;
  const jointNames = source === 'ride' && design ? designBodyNames(design) : bodies.map((b) => b.name || '—');

  const [running, setRunning] = useState(false);
  const [cycleS, setCycleS] = useState('');
  const run = () => {
    const request =
      source === 'ride'
        ? design
          ? rideRequest(design, rideMotion, cycleS)
          : null
        : manualRequest(bodies, manualMotion, cycleS);
    if (!request) return;
    setRunning(true);
    // Stops and free joints take the engine a moment: let the button show it is working before it holds
    // the thread.
    setTimeout(() => {
      try {
        setOutcome(runCalculator(request));
      } finally {
        setRunning(false);
      }
    }, 20);
  };

  const switchSource = (s: Source) => setSource(s);

  const inputs = (
    <View style={styles.inputs}>
      <Segmented
        label="Where the bodies come from"
        value={source}
        onChange={switchSource}
        options={[
          { value: 'ride', label: 'From a ride' },
          { value: 'manual', label: 'Enter bodies' },
        ]}
      />
      {source === 'ride' ? (
        <RidePicker rides={rides} rideId={rideId} onPick={setRideId} ride={ride} />
      ) : (
        <BodiesEditor
          bodies={bodies}
          onChange={setBodies}
          onMotionCount={(n) => setManualMotion((m) => fit(m, n))}
        />
      )}

      {motion.length > 0 ? (
        <MotionCard motion={motion} jointNames={jointNames} system={system} onChange={setMotion} />
      ) : null}
      {motion.length > 0 ? (
        <NumberField
          label="Cycle length"
          unit="s"
          value={cycleS}
          onChange={setCycleS}
          hint="Empty: the longest natural cycle among the joints (a free swing: one period; a record: its length)."
        />
      ) : null}

      <Button label="Run load check" onPress={run} busy={running} disabled={source === 'ride' && !design} />
      {outcome && !outcome.ok ? <InputProblems issues={outcome.issues} jointNames={jointNames} /> : null}
    </View>
  );

  const results =
    outcome && outcome.ok ? (
      <CycleResults result={outcome.result} system={system} xAxis={outcome.xAxis} cases={outcome.cases} />
    ) : (
      <Card>
        <Text muted>
          {source === 'ride'
            ? 'Pick a ride to see its pivot loads at the design motion, then change the motion to what you measured.'
            : 'Enter the bodies from the pivot outward, choose each joint’s motion, and run the check.'}
        </Text>
      </Card>
    );

  return (
    <RoleGate roles={['inspector', 'supervisor', 'admin']}>
      {() => (
        <Screen
          title="Load check"
          subtitle="Pivot loads and rider accelerations over one ride cycle."
          actions={
            <Segmented
              label="Units"
              value={system}
              onChange={setSystem}
              options={[
                { value: 'si', label: 'SI' },
                { value: 'us', label: 'US' },
              ]}
            />
          }
        >
          {wide ? (
            <View style={styles.wideRow}>
              <View style={styles.wideInputs}>{inputs}</View>
              <View style={styles.wideResults}>{results}</View>
            </View>
          ) : (
            <>
              {inputs}
              <SectionTitle>Result</SectionTitle>
              {results}
            </>
          )}
        </Screen>
      )}
    </RoleGate>
  );
}

/** The rides to check, one chosen, and which design version of it the check uses. */
function RidePicker({
  rides,
  rideId,
  onPick,
  ride,
}: {
  rides: ReturnType<typeof useRidesQuery>;
  rideId: string | null;
  onPick: (id: string) => void;
  ride: ReturnType<typeof useRideQuery>;
}) {
  return (
    <Card>
      <Text variant="heading">Ride</Text>
      <QueryState query={rides} empty={(r) => r.length === 0}>
        {(list) => (
          <View style={styles.rideList}>
            {list.map((r) => {
              const selected = r.id === rideId;
              return (
                <Pressable
                  key={r.id}
                  role="radio"
                  aria-checked={selected}
                  accessibilityLabel={r.name}
                  onPress={() => onPick(r.id)}
                  style={StyleSheet.flatten([styles.rideOption, selected && styles.rideOptionSelected])}
                >
                  <View style={styles.rideOptionText}>
                    <Text variant="heading">{r.name}</Text>
                    <Text variant="small" muted>
                      {rideClassLabel[r.rideClass]}
                    </Text>
                  </View>
                  <RideStatusMark status={r.status} compact />
                </Pressable>
              );
            })}
          </View>
        )}
      </QueryState>
      {rideId && ride.data && !ride.data.design ? (
        <Text color={colors.near}>This ride has no design data yet. Ask an administrator to enter it.</Text>
      ) : null}
      {ride.data?.design ? (
        <Text variant="small" muted>
          Design data v{ride.data.design.version} · {ride.data.design.data.source.document} rev.{' '}
          {ride.data.design.data.source.revision}
        </Text>
      ) : null}
    </Card>
  );
}

function InputProblems({
  issues,
  jointNames,
}: {
  issues: Extract<CalculatorOutcome, { ok: false }>['issues'];
  jointNames: string[];
}) {
  return (
    <View style={styles.errors} role="alert">
      <Text variant="heading" color={colors.danger}>
        Check these inputs
      </Text>
      {issues.map((i) => (
        <Text key={`${i.path}${i.message}`} color={colors.danger}>
          {describePath(i.path, jointNames)}: {i.message}
        </Text>
      ))}
    </View>
  );
}

function fit(rows: MotionRow[], n: number): MotionRow[] {
  return rows.length >= n
    ? rows.slice(0, n)
    : [...rows, ...Array.from({ length: n - rows.length }, newMotion)];
}

/** "bodies.1.massKg" → "Gondola · mass" for people; unknown paths are shown as they are. */
function describePath(path: string, names: string[]): string {
  const parts = path.split('.');
  const fields: Record<string, string> = {
    massKg: 'mass',
    cgM: 'centre of gravity',
    inertiaCgKgM2: 'inertia',
    tipM: 'next pivot',
    rpm: 'speed',
    amplitudeRad: 'amplitude',
    periodS: 'period',
    angleRad: 'angle',
    rampTimeS: 'ramp time',
    toRpm: 'speed',
    name: 'name',
    durationS: 'cycle length',
    record: 'measured record',
    timeS: 'record times',
    rateRadS: 'record rates',
    cutoffHz: 'cut-off',
    serviceDecelRadS2: 'service stop',
    emergencyDecelRadS2: 'emergency stop',
  };
  if ((parts[0] === 'bodies' || parts[0] === 'profiles') && parts[1] !== undefined) {
    const i = Number(parts[1]);
    const who = parts[0] === 'bodies' ? (names[i] ?? `Body ${i + 1}`) : `Joint ${i + 1}`;
    return parts[2] ? `${who} · ${fields[parts[2]] ?? parts[2]}` : who;
  }
  const field = parts.length === 1 ? fields[path] : undefined;
  return field ? field[0].toUpperCase() + field.slice(1) : path;
}

function BodiesEditor({
  bodies,
  onChange,
  onMotionCount,
}: {
  bodies: BodyRow[];
  onChange: (b: BodyRow[]) => void;
  onMotionCount: (n: number) => void;
}) {
  const update = (i: number, patch: Partial<BodyRow>) =>
    onChange(bodies.map((b, k) => (k === i ? { ...b, ...patch } : b)));
  const resize = (next: BodyRow[]) => {
    onChange(next);
    onMotionCount(next.length);
  };
  return (
    <Card>
      <Text variant="heading">Bodies, from the ground pivot outward</Text>
      <Text variant="small" muted>
        Each body’s frame starts at its own pivot. The next pivot is where the following body hangs.
      </Text>
      {bodies.map((b, i) => (
        <View key={i} style={styles.body}>
          <View style={styles.bodyHead}>
            <Text variant="label" muted>
              BODY {i + 1}
            </Text>
            {bodies.length > 1 ? (
              <Button
                label="Remove"
                tone="quiet"
                onPress={() => resize(bodies.filter((_, k) => k !== i))}
                accessibilityLabel={`Remove body ${i + 1}`}
              />
            ) : null}
          </View>
          <TextField label="Name" value={b.name} onChangeText={(name) => update(i, { name })} />
          <View style={styles.fieldRow}>
            <NumberField
              label="Mass"
              unit="kg"
              value={b.massKg}
              onChange={(massKg) => update(i, { massKg })}
            />
            <NumberField
              label="Inertia about CG"
              unit="kg·m²"
              value={b.inertia}
              onChange={(inertia) => update(i, { inertia })}
            />
          </View>
          <View style={styles.fieldRow}>
            <NumberField label="CG x" unit="m" value={b.cgX} onChange={(cgX) => update(i, { cgX })} />
            <NumberField label="CG y" unit="m" value={b.cgY} onChange={(cgY) => update(i, { cgY })} />
          </View>
          {i < bodies.length - 1 ? (
            <View style={styles.fieldRow}>
              <NumberField
                label="Next pivot x"
                unit="m"
                value={b.tipX}
                onChange={(tipX) => update(i, { tipX })}
              />
              <NumberField
                label="Next pivot y"
                unit="m"
                value={b.tipY}
                onChange={(tipY) => update(i, { tipY })}
              />
            </View>
          ) : null}
        </View>
      ))}
      {bodies.length < 10 ? (
        <Button label="Add a body" tone="quiet" onPress={() => resize([...bodies, newBody(bodies.length)])} />
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  inputs: { gap: space.lg },
  wideRow: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  wideInputs: { width: 420, gap: space.lg },
  wideResults: { flex: 1, minWidth: 0 },
  rideList: { gap: space.sm },
  rideOption: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.md,
    minHeight: 56,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  rideOptionSelected: { borderColor: colors.base, backgroundColor: colors.accentSoft },
  rideOptionText: { flexShrink: 1 },
  fieldRow: { flexDirection: 'row', gap: space.md, flexWrap: 'wrap' },
  body: { gap: space.sm, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  bodyHead: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center' },
  errors: { backgroundColor: colors.overSoft, padding: space.md, borderRadius: radius.md, gap: space.xs },
});
