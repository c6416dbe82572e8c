import { PageHeader } from '@/components/ui/app-shell.tsx';
import { ReviewQueue } from '@/features/reviews/index.ts';
import { useDocumentTitle } from '@/lib/use-document-title.ts';

/** /reviews — entries awaiting the signed-in PI. */
export default function ReviewQueueRoute() {
  useDocumentTitle('Awaiting your review');
  return (
    <div>
      <PageHeader title="Awaiting your review">Entries submitted in notebooks where you are PI, oldest first.</PageHeader>
      <ReviewQueue />
    </div>
  );
}
