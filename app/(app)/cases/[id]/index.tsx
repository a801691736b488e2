export { CaseScreen as default } from '@/features/cases/case-screen';
