import type { Ref } from 'react';
import { StyleSheet, View } from 'react-native';

import { space } from '@/constants/theme';

import { Button } from '@/components/ui/button';
import { Pending } from '@/components/ui/query-state';

export type LoadMoreProps = {
  /** The server said there is another page. */
  hasMore: boolean;
  /** The next page is on its way. */
  loading: boolean;
  onLoadMore: () => void;
};

/** The end of a paged list: "Loading more" while a page comes, else a "Load more" button while there is one. */
export function LoadMoreView({ hasMore, loading, onLoadMore, anchor }: LoadMoreProps & { anchor?: Ref<View> }) {
  if (!hasMore && !loading) return null;
  return (
    <View ref={anchor} style={styles.box} testID="load-more-end">
      {loading ? <Pending label="Loading more…" /> : <Button label="Load more" variant="secondary" onPress={onLoadMore} testID="load-more" />}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { alignItems: 'center', paddingVertical: space.md },
});
