/**
 * The share token must not leave Lobewright, so the payment page returns the
 * owner to /share/back; the share page keeps its own address in this tab's
 * session storage just before it opens the payment page.
 */
const KEY = 'lobewright.owner-return';

export function rememberOwnerPage(path: string) {
  if (typeof sessionStorage !== 'undefined') sessionStorage.setItem(KEY, path);
}

/** The token of the remembered share page, if this tab opened the payment page from one. */
export function rememberedOwnerToken(): string | null {
  if (typeof sessionStorage === 'undefined') return null;
  const path = sessionStorage.getItem(KEY);
  const match = path ? /^\/share\/([A-Za-z0-9_-]+)$/.exec(path) : null;
  return match?.[1] ?? null;
}
