import { LoadMoreView, type LoadMoreProps } from '@/components/ui/load-more-view';

/** End of a paged list; on phones the list's own end (or the button) asks for the next page. */
export function LoadMore(props: LoadMoreProps) {
  return <LoadMoreView {...props} />;
}
