import { PageHeader } from '@/components/ui/page-header';
import { outboxMessagePath } from '@/config/paths';
import { OutboxTable } from '@/features/mail/components/outbox-table';

export default function OutboxRoute() {
  return (
    <>
      <PageHeader
        title="Outbox"
        description="Every message Kilocycle has sent (certificates issued, jobs returned, recall reminders), as the mail server it talks to captured it."
      />
      <OutboxTable messagePath={outboxMessagePath} />
    </>
  );
}
