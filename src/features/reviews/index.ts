export { SubmitForReviewButton } from './components/submit-for-review-button.tsx';
export { SignatureBlock } from './components/signature-block.tsx';
export { ReviewQueue } from './components/review-queue.tsx';
export { EntryReviewPage } from './components/entry-review-page.tsx';
export { EntryComparePage } from './components/entry-compare-page.tsx';
export { useReview } from './api/get-review.ts';
export { EntryCrumbs } from './components/entry-crumbs.tsx';
