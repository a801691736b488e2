export { TreeScreen as default } from '@/features/trees/tree-screen';
