/** Native apps have no page-wide CSS; the web build uses global-style.web.tsx. */
export function GlobalStyle() {
  return null;
}
