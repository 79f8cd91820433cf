import type { ReactNode } from "react";

type FramedTableProps = {
  /** The table's accessible name (read by screen readers and the browser tests). */
  caption: string;
  /** The header cells (`<th scope="col">…</th>`); they take the shared header style. */
  head: ReactNode;
  /** The body rows. */
  children: ReactNode;
  /** Optional totals rows, under a heavier rule. */
  foot?: ReactNode;
};

/** A plain figures table in the app's frame: scrolls sideways on narrow screens, small upper-case headers. */
export function FramedTable({ caption, head, children, foot }: FramedTableProps) {
  return (
    <div className="relative overflow-x-auto rounded-md border border-rule">
      <table className="w-full border-collapse text-left text-body">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-deep text-note font-semibold tracking-wide text-ink-soft uppercase [&_th]:px-3 [&_th]:py-2 [&_th]:text-left">
          <tr>{head}</tr>
        </thead>
        <tbody>{children}</tbody>
        {foot && <tfoot className="border-t-2 border-rule-strong font-semibold">{foot}</tfoot>}
      </table>
    </div>
  );
}
