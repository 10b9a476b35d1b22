import { useState } from 'react';

import { Card } from '@/components/card';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { colors } from '@/components/theme';
import { applyThemeChoice, themeChoiceShowsAtOnce } from '@/components/theme-colors';
import { type ThemeChoice } from '@/components/theme-resolve';
import { readThemeChoice } from '@/components/theme-store';

const options: { value: ThemeChoice; label: string }[] = [
  { value: 'system', label: 'System' },
  { value: 'light', label: 'Light' },
  { value: 'dark', label: 'Dark' },
];

/**
 * The colour theme on this device: as the system is set, or always light or dark. The web shows a new
 * choice at once; a phone builds its styles at start, so it shows it when the app is next opened.
 */
export function ThemeCard() {
  const [choice, setChoice] = useState<ThemeChoice>(readThemeChoice);
  const [unsaved, setUnsaved] = useState(false);
  const choose = (next: ThemeChoice) => {
    setUnsaved(!applyThemeChoice(next));
    setChoice(next);
  };
  return (
    <Card testID="theme-card">
      <Text variant="heading" accessibilityRole="header">
        Colour theme
      </Text>
      <Text muted>
        System follows this device&apos;s light or dark setting. The choice is kept on this device only.
      </Text>
      <Segmented label="Colour theme" value={choice} options={options} onChange={choose} />
      {themeChoiceShowsAtOnce ? null : (
        <Text variant="small" muted>
          On this phone a new choice shows the next time Pivotwatch is opened.
        </Text>
      )}
      {unsaved ? (
        <Text variant="small" color={colors.danger}>
          This device would not store the choice, so it will not last.
        </Text>
      ) : null}
    </Card>
  );
}
