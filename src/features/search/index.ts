export { SearchPage } from './components/search-page.tsx';
export { useSearchEntries } from './api/search-entries.ts';
