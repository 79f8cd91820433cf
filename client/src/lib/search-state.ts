import { useEffect, useState } from "react";
import { useSearchParams } from "react-router-dom";
import type { z } from "zod";

/** Query params that carry a keyset cursor: each is cleared with the page number. */
const KEYSET_CURSORS = ["before", "after"];

/**
 * A view's inputs kept in the URL's search params (so it can be bookmarked and shared), each read with the
 * field's own schema from a shared query schema; a value that does not parse is dropped rather than breaking
 * the page. `update` sets some values (undefined or "" removes one); any change but `page` returns to page 1.
 */
export function useSearchState<S extends z.ZodObject>(schema: S) {
  type Params = Partial<z.output<S>>;
  const [search, setSearch] = useSearchParams();
  const params: Record<string, unknown> = {};
  for (const [key, field] of Object.entries(schema.shape as Record<string, z.ZodType>)) {
    const raw = search.get(key);
    if (raw === null || raw === "") continue;
    const parsed = field.safeParse(raw);
    if (parsed.success) params[key] = parsed.data;
  }
  const update = (changes: Params) =>
    setSearch((prev) => {
      const next = new URLSearchParams(prev);
      for (const [k, v] of Object.entries(changes)) {
        if (v === undefined || v === null || v === "") next.delete(k);
        else next.set(k, String(v));
      }
      // A keyset cursor (the audit trail's `before`, the plan list's `after` and `before`) belongs to the page it was read for,
      // so it goes with the page.
      if (!("page" in changes)) {
        next.delete("page");
        for (const cursor of KEYSET_CURSORS) next.delete(cursor);
      }
      return next;
    });
  return { params: params as Params, update };
}

/**
 * Text typed into a search box, handed to `commit` a moment after the last keystroke (so each key is not a
 * request); `value` is what the URL holds now.
 */
export function useDebouncedText(value: string, commit: (text: string | undefined) => void, ms = 300) {
  const [text, setText] = useState(value);
  useEffect(() => {
    if (text.trim() === value) return;
    const t = setTimeout(() => commit(text.trim() || undefined), ms);
    return () => clearTimeout(t);
  }, [text, value, commit, ms]);
  return [text, setText] as const;
}
