import { Mailbox } from '@client/features/dev-mail/components/mailbox';

export default function DevMailRoute() {
  return <Mailbox />;
}
