export { NewCaseScreen as default } from '@/features/cases/editor-screen';
