export { SearchScreen as default } from '@/features/search/search-screen';
