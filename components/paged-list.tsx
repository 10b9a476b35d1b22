import { StyleSheet, View } from 'react-native';

import { Pager } from '@/components/pager';
import { QueryState } from '@/components/query-state';
import { space } from '@/components/theme';

type Page = { page: number; pageSize: number; total: number };

/**
 * One page of a list the server pages, with the pager under it. Page 1 is handed on as `undefined` so
 * the URL of a list's first page carries no page.
 */
export function PagedList<P extends Page>({
  query,
  noun,
  setPage,
  children,
}: {
  query: { isPending: boolean; error: unknown; data: P | undefined; refetch: () => unknown };
  /** What the pager counts; a function for a noun that changes with the total ("1 ride"). */
  noun: string | ((total: number) => string);
  setPage: (page: number | undefined) => void;
  children: (page: P) => React.ReactNode;
}) {
  return (
    <QueryState query={query}>
      {(page) => (
        <View style={styles.list}>
          {children(page)}
          <Pager
            page={page.page}
            pageSize={page.pageSize}
            total={page.total}
            noun={typeof noun === 'string' ? noun : noun(page.total)}
            onPage={(p) => setPage(p === 1 ? undefined : p)}
          />
        </View>
      )}
    </QueryState>
  );
}

const styles = StyleSheet.create({ list: { gap: space.md } });
