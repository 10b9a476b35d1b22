import { objectIsHeading, titled } from '@/components/route-title';
import { NoticeScreen } from '@/features/shell/lazy-screens';

export default titled(NoticeScreen, { page: 'Notice', object: objectIsHeading });
