import { MailboxScreen } from '@/components/mailbox/mailbox-screen';

/** Development only: the e-mails Lobewright would have sent, kept by the local transport. */
export default function Mailbox() {
  return <MailboxScreen />;
}
