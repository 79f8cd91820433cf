import { useState } from "react";
import { useDebounced } from "./use-debounced";

/** Where an answered page sits in the whole list, as the server's paged list routes say it. */
type PageFacts = { page: number; pageSize: number; total: number; totalCapped?: boolean };

/**
 * A list the server pages, narrowed by a search box (the profiles and users pages): the query to send (the typed
 * text trimmed, a moment after the last key; the page, back to 1 whenever the text changes), the search box's
 * value and onChange, and the pager's props for an answer.
 */
export function usePagedSearch(pageSize: number) {
  const [text, setText] = useState("");
  const [page, setPage] = useState(1);
  const q = useDebounced(text.trim(), 250);
  return {
    query: { q: q || undefined, page, pageSize },
    searchBox: {
      value: text,
      onChange: (next: string) => {
        setText(next);
        setPage(1);
      },
    },
    /** The Pager's props, or null while the whole list fits on the first page (no pager to show). */
    pager: ({ page: answered, pageSize: size, total, totalCapped }: PageFacts) =>
      total > size || page > 1 ? { page: answered, pageSize: size, total, totalCapped, onPage: setPage } : null,
  };
}
