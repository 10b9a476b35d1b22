import { InspectorHome } from '@/features/home/inspector-home';

export default InspectorHome;
