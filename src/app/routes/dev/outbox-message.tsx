import { useParams } from 'react-router';
import { OutboxMessageView } from '@/features/outbox/components/outbox-message.tsx';

export default function OutboxMessageRoute() {
  const { messageId = '' } = useParams();
  return <OutboxMessageView key={messageId} id={messageId} />;
}
