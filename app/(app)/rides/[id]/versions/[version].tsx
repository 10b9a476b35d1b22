import { DesignVersionScreen } from '@/features/registry/design-screens';

export default DesignVersionScreen;
