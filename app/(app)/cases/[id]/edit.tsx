export { EditCaseScreen as default } from '@/features/cases/editor-screen';
