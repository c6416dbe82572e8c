export { EntryLog, EntryStatusBadge } from './components/entry-log.tsx';
export { EntryPage } from './components/entry-page.tsx';
