import { Modal, Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { CheckField } from '@/components/check-field';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { type ShortcutPage, keyWords, shortcutHelpTitle, shortcutKeys } from '@/features/review/shortcuts';
import { keyboardShortcuts, setShortcutsOn, useShortcutsOn } from '@/features/review/use-shortcuts';

/**
 * The button that opens the list of the page's keyboard shortcuts (also opened with ?), and that list as a
 * dialog: labelled, modal (the web Modal keeps Tab inside it and hands focus back to where it was when it
 * closes), closed with its button, Escape or ? again. Nothing on a phone, which has no keyboard.
 */
export function ShortcutHelp({
  page,
  open,
  onOpenChange,
}: {
  page: ShortcutPage;
  open: boolean;
  onOpenChange: (open: boolean) => void;
}) {
  const on = useShortcutsOn();
  if (!keyboardShortcuts) return null;
  const close = () => onOpenChange(false);
  return (
    <>
      <Pressable
        role="button"
        aria-keyshortcuts="?"
        accessibilityHint="Or press the question mark key"
        onPress={() => onOpenChange(true)}
        style={styles.opener}
      >
        <Feather name="help-circle" size={16} color={colors.textMuted} />
        <Text variant="label" muted>
          {shortcutHelpTitle}
        </Text>
      </Pressable>
      <Modal
        visible={open}
        transparent
        animationType="none"
        onRequestClose={close}
        aria-label={shortcutHelpTitle}
      >
        <View style={styles.frame}>
          <Pressable
            style={styles.backdrop}
            onPress={close}
            accessibilityLabel="Close the shortcuts"
            aria-hidden
            tabIndex={-1}
          />
          <View style={styles.panel}>
            <View style={styles.head}>
              <Text variant="title" role="heading" aria-level={2}>
                {shortcutHelpTitle}
              </Text>
              <Button label="Close" tone="quiet" onPress={close} icon={<Feather name="x" size={18} />} />
            </View>
            <View role="list" accessibilityLabel={`Keys on this page`}>
              {shortcutKeys[page].map((row) => (
                <View key={row.action} role="listitem" style={styles.row}>
                  <View style={styles.keys}>
                    {row.keys.map((k, i) => (
                      <View key={k} style={styles.keyPair}>
                        {i > 0 ? (
                          <Text variant="small" muted>
                            or
                          </Text>
                        ) : null}
                        <Text variant="figure" style={styles.key}>
                          {keyWords(k)}
                        </Text>
                      </View>
                    ))}
                  </View>
                  <Text style={styles.words}>{row.words}</Text>
                </View>
              ))}
            </View>
            <Text variant="small" muted>
              The keys do nothing while you type in a field. Escape closes this list.
            </Text>
            <CheckField
              label="Use these keys (turn them off if you speak to the page or they get in the way)"
              value={on}
              onChange={setShortcutsOn}
            />
          </View>
        </View>
      </Modal>
    </>
  );
}

const styles = StyleSheet.create({
  opener: {
    flexDirection: 'row',
    alignItems: 'center',
    alignSelf: 'flex-end',
    gap: space.xs + 2,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  frame: { flex: 1, alignItems: 'center', justifyContent: 'center', padding: space.lg },
  backdrop: {
    position: 'absolute',
    top: 0,
    right: 0,
    bottom: 0,
    left: 0,
    // Opaque, like every modal's backdrop: the queue behind does not show through the help.
    backgroundColor: colors.base,
  },
  panel: {
    width: '100%',
    maxWidth: 560,
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    padding: space.xl,
    gap: space.md,
  },
  head: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.md },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.lg,
    paddingVertical: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.surfaceSunk,
  },
  keys: { flexDirection: 'row', alignItems: 'center', gap: space.xs, width: 150 },
  keyPair: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  key: {
    minWidth: 32,
    textAlign: 'center',
    paddingHorizontal: space.sm,
    borderRadius: radius.sm,
    borderWidth: 1,
    borderBottomWidth: 3,
    borderColor: colors.border,
    backgroundColor: colors.surfaceSunk,
  },
  words: { flex: 1 },
});
