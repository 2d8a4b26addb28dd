import { pageCss } from '@/constants/page-css';

/** Adds the page-wide CSS on web (focus ring, print rules). */
export function GlobalStyle() {
  return (
    <style href="lobewright-page" precedence="default">
      {pageCss}
    </style>
  );
}
