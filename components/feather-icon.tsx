/**
 * The Feather icon set limited to the icons the app draws (`feather-glyphs.generated.ts`), so the web
 * loads a small font of those glyphs instead of the whole set. `name` accepts only those icons: using a
 * new one fails tsc until `npx tsx scripts/build-fonts.ts` adds it to the table and the web font.
 *
 * An icon is drawn for the eye: beside words that say the same, it is hidden from assistive technology
 * (its glyph is a private-use character that a screen reader would spell out, and that would stand in a
 * control's visible name without being in its spoken one: WCAG 2.5.3). Give it a name of its own
 * (`accessibilityLabel`) where it stands alone.
 */
import createIconSet from '@expo/vector-icons/createIconSet';
import type { ComponentProps } from 'react';

import { iconFontSource } from '@/components/app-fonts';
import { featherGlyphs } from '@/components/feather-glyphs.generated';

const FeatherSet = createIconSet(featherGlyphs, 'feather', iconFontSource);

export type IconName = keyof typeof featherGlyphs;

export default function Feather(props: ComponentProps<typeof FeatherSet>) {
  const named = props.accessibilityLabel != null || props['aria-label'] != null;
  return <FeatherSet aria-hidden={named ? undefined : true} {...props} />;
}
