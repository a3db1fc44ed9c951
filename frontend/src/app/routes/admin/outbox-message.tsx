import { useParams } from 'react-router-dom';
import { NotFound } from '@/components/errors/not-found';
import { paths } from '@/config/paths';
import { MailMessage } from '@/features/mail/components/mail-message';

export default function OutboxMessageRoute() {
  const id = Number(useParams().messageId);
  if (!Number.isInteger(id) || id <= 0) return <NotFound />;
  return <MailMessage key={id} id={id} outboxPath={paths.adminOutbox} />;
}
