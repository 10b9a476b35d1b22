import { DesignImportScreen } from '@/features/registry/design-import-screen';

export default DesignImportScreen;
