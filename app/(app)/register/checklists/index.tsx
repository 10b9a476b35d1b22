export { ChecklistsListScreen as default } from '@/features/registry/checklists-list-screen';
