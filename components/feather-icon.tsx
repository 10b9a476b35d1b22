/**
 * The Feather icon set limited to the icons the app draws (`feather-glyphs.generated.ts`), so the web
 * loads a small font of those glyphs instead of the whole set. `name` accepts only those icons: using a
 * new one fails tsc until `npx tsx scripts/build-fonts.ts` adds it to the table and the web font.
 */
import createIconSet from '@expo/vector-icons/createIconSet';

import { iconFontSource } from '@/components/app-fonts';
import { featherGlyphs } from '@/components/feather-glyphs.generated';

const Feather = createIconSet(featherGlyphs, 'feather', iconFontSource);

export type IconName = keyof typeof featherGlyphs;
export default Feather;
