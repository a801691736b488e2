export { CaseListScreen as default } from '@/features/cases/case-list-screen';
