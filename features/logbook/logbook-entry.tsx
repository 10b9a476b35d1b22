import { Link, type Href } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import Feather, { type IconName } from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { fileTypes, saveOrShareApiFile } from '@/features/api/ui';
import {
  logbookKindWords,
  type LogbookDocument,
  type LogbookEvent,
  type LogbookKind,
} from '@/features/logbook/schema';
import { formatDateTime } from '@/lib/dates';

/** Each kind's icon, beside its word (never alone). */
export const logbookKindIcon: Record<LogbookKind, IconName> = {
  inspection: 'list',
  decision: 'check-circle',
  finding: 'alert-triangle',
  corrective_action: 'edit-3',
  notice: 'mail',
  ndt: 'crosshair',
  design: 'layers',
  status: 'activity',
  incident: 'alert-octagon',
  part: 'git-commit',
  setup: 'calendar',
  daily_check: 'sun',
  bulletin: 'file-text',
};

/**
 * One entry: when (on the site's clock) and what kind, its title and lines, who, and where it lives in
 * the app and the files that go with it. On a desk the time and kind stand in a column of their own.
 */
export function LogbookEntry({ event: e, zone, wide }: { event: LogbookEvent; zone: string; wide: boolean }) {
  return (
    <View
      style={[styles.entry, wide && styles.entryWide]}
      accessibilityLabel={`${logbookKindWords[e.kind].label}: ${e.title}`}
    >
      <View style={wide ? styles.side : styles.topRow}>
        <Text variant="figure">{formatDateTime(e.at, zone)}</Text>
        <View style={styles.kind}>
          <Feather name={logbookKindIcon[e.kind]} size={15} color={colors.base} />
          <Text variant="label" color={colors.base}>
            {logbookKindWords[e.kind].label}
          </Text>
        </View>
      </View>
      <View style={styles.body}>
        <Text variant="heading">{e.title}</Text>
        {e.detail.map((line, i) => (
          <Text key={i} variant="small">
            {line}
          </Text>
        ))}
        {e.who ? (
          <Text variant="small" muted>
            {e.who}
          </Text>
        ) : null}
        {e.link || e.documents.length > 0 ? (
          <View style={styles.actions}>
            {e.link ? (
              <Link href={e.link.href as Href} asChild>
                <Pressable role="link" style={styles.action}>
                  <Text variant="label" color={colors.accent}>
                    {e.link.label}
                  </Text>
                  <Feather name="chevron-right" size={16} color={colors.accent} />
                </Pressable>
              </Link>
            ) : null}
            {e.documents.map((d) => (
              <DocumentButton key={d.apiPath} doc={d} />
            ))}
          </View>
        ) : null}
      </View>
    </View>
  );
}

function DocumentButton({ doc }: { doc: LogbookDocument }) {
  const [state, setState] = useState<{ busy: boolean; message: string | null; ok: boolean }>({
    busy: false,
    message: null,
    ok: true,
  });
  const open = async () => {
    setState({ busy: true, message: null, ok: true });
    try {
      const words = await saveOrShareApiFile(doc.apiPath, doc.fileName, fileTypes.pdf);
      setState({ busy: false, message: words, ok: true });
    } catch (err) {
      setState({
        busy: false,
        message: err instanceof Error ? err.message : 'It could not be fetched.',
        ok: false,
      });
    }
  };
  return (
    <View>
      <Pressable role="button" onPress={() => void open()} disabled={state.busy} style={styles.action}>
        <Feather name="paperclip" size={15} color={colors.accent} />
        <Text variant="label" color={colors.accent}>
          {state.busy ? `${doc.label} …` : doc.label}
        </Text>
      </Pressable>
      {state.message ? (
        <Text
          variant="small"
          role={state.ok ? 'status' : 'alert'}
          color={state.ok ? undefined : colors.danger}
        >
          {state.message}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  entry: {
    padding: space.md,
    gap: space.xs,
    borderBottomWidth: 1,
    borderBottomColor: colors.surfaceSunk,
  },
  entryWide: { flexDirection: 'row', gap: space.lg, paddingHorizontal: space.lg },
  side: { width: 190, gap: space.xs },
  topRow: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
  },
  kind: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    alignSelf: 'flex-start',
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    borderRadius: radius.sm,
    backgroundColor: colors.surfaceSunk,
  },
  body: { flex: 1, minWidth: 0, gap: 2 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, marginTop: space.xs },
  action: { flexDirection: 'row', alignItems: 'center', gap: space.xs, minHeight: layout.touchTarget },
});
