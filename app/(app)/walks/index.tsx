export { WalksScreen as default } from '@/features/walks/walks-screen';
