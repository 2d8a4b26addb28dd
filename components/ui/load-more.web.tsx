import { useEffect, useRef } from 'react';
import type { View } from 'react-native';

import { LoadMoreView, type LoadMoreProps } from '@/components/ui/load-more-view';

/** End of a paged list: the next page loads as this comes within a screen of view; the button stays as a fallback. */
export function LoadMore(props: LoadMoreProps) {
  const { hasMore, loading, onLoadMore } = props;
  const anchor = useRef<View>(null);
  useEffect(() => {
    // react-native-web renders a View as a DOM element.
    const node = anchor.current as unknown as Element | null;
    if (!node || !hasMore || loading || typeof IntersectionObserver === 'undefined') return;
    const observer = new IntersectionObserver(
      (entries) => {
        if (entries.some((e) => e.isIntersecting)) onLoadMore();
      },
      { rootMargin: '0px 0px 600px 0px' },
    );
    observer.observe(node);
    return () => observer.disconnect();
  }, [hasMore, loading, onLoadMore]);
  return <LoadMoreView {...props} anchor={anchor} />;
}
