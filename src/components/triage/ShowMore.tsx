import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import type { PagedRows } from './paged';

/** "Show more" under a paged list, with how many are shown, and the error of a page that failed. */
export function ShowMore({ list, noun }: { list: PagedRows; noun: string }) {
  const page = list.page;
  if (!page) return null;
  return (
    <div className="space-y-2">
      {list.error && list.state === 'ready' && (
        <Alert tone="danger" title={`Could not load more ${noun}`} live>
          <p>{list.error.message}</p>
        </Alert>
      )}
      <p className="text-ink-soft">
        Showing {list.rows.length} of {page.total} {noun}.
      </p>
      {page.nextOffset !== null && (
        <Button variant="secondary" busy={list.loadingMore} onClick={list.loadMore}>
          Show {Math.min(page.limit, page.total - list.rows.length)} more {noun}
        </Button>
      )}
    </div>
  );
}
