import { objectLeadsSubtitle, titled } from '@/components/route-title';
import { InspectionReviewScreen } from '@/features/shell/lazy-screens';

export default titled(InspectionReviewScreen, { page: 'Review', object: objectLeadsSubtitle });
