export { TreesScreen as default } from '@/features/trees/trees-screen';
