export { NewWalkScreen as default } from '@/features/walks/new-walk-screen';
