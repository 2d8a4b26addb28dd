import { rememberOwnerPage } from '@/lib/owner-return';

/** Opens the payment page in this tab, so the owner comes back here when done. */
export function openPaymentPage(url: string) {
  rememberOwnerPage(window.location.pathname);
  window.location.assign(url);
}
