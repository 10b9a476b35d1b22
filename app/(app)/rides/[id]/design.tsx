import { DesignScreen } from '@/features/registry/design-screens';

export default DesignScreen;
