import { IncomingScreen } from '@/components/order/incoming-screen';

/** The grinding shop's inbox: every sheet revision issued to it, newest first, a page at a time. */
export default function Incoming() {
  return <IncomingScreen />;
}
