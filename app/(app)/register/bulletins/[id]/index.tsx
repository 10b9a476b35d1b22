import { objectIsHeading, titled } from '@/components/route-title';
import { BulletinScreen } from '@/features/shell/lazy-screens';

export default titled(BulletinScreen, { page: 'Bulletin', object: objectIsHeading });
