export { EntryLog, EntryStatusBadge } from './components/entry-log.tsx';
export { EntryPage } from './components/entry-page.tsx';
export type { EntryPageSlots, EntrySlotContext } from './components/entry-page.tsx';
