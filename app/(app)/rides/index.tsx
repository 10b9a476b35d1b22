import { RidesListScreen } from '@/features/registry/rides-list-screen';

export default RidesListScreen;
