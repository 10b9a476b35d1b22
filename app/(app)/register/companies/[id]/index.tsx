import { objectIsHeading, titled } from '@/components/route-title';
import { CompanyScreen } from '@/features/shell/lazy-screens';

export default titled(CompanyScreen, { page: 'Company', object: objectIsHeading });
