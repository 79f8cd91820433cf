import { Button } from "@/components/button";
import { formatCount, formatGrouped } from "@/lib/format";

type PagerProps = {
  page: number;
  pageSize: number;
  total: number;
  /** The server counted up to `total` and stopped: there are more, so there is no last page to name. */
  totalCapped?: boolean;
  /**
   * Lists read by cursor: the rows this page holds and whether the server named a cursor for the page after it. With a
   * capped total these are what say where the list ends; a page number past the cap is refused by the server.
   */
  cursor?: { rows: number; hasNext: boolean };
  onPage: (page: number) => void;
  noun: string;
};

/**
 * "Plans 21–40 of 57" (or "of 10,000+") with previous / next. Pages count from 1, as the server's `page` does. The rows
 * are named with every digit (a place in the list, not a magnitude to round).
 */
export function Pager({ page, pageSize, total, totalCapped = false, cursor, onPage, noun }: PagerProps) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = cursor
    ? first + Math.max(0, cursor.rows - 1)
    : totalCapped
      ? page * pageSize
      : Math.min(total, page * pageSize);
  const hasNext = cursor ? cursor.hasNext && (totalCapped || page < pages) : totalCapped || page < pages;
  const of = totalCapped ? `${formatCount(total)}+` : `${formatCount(total)} · page ${page} of ${pages}`;
  return (
    <nav
      aria-label={`${noun} pages`}
      className="flex flex-wrap items-center justify-between gap-3 text-note text-ink-soft"
    >
      <span>
        {noun} {formatGrouped(first)}–{formatGrouped(last)} of {of}
      </span>
      <span className="flex gap-2">
        <Button variant="secondary" size="sm" disabled={page <= 1} onClick={() => onPage(page - 1)}>
          Previous page
        </Button>
        <Button variant="secondary" size="sm" disabled={!hasNext} onClick={() => onPage(page + 1)}>
          Next page
        </Button>
      </span>
    </nav>
  );
}
