import { objectIsHeading, titled } from '@/components/route-title';
import { PersonScreen } from '@/features/shell/lazy-screens';

export default titled(PersonScreen, { page: 'Person', object: objectIsHeading });
