export { HomeScreen as default } from '@/features/home/home-screen';
