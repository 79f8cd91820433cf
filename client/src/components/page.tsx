import type { ReactNode } from "react";

/** Standard page frame: title (also the document title), optional lead paragraph, content. */
export function Page({ title, lead, children }: { title: string; lead?: ReactNode; children: ReactNode }) {
  return (
    <section className="flex flex-col gap-6">
      <title>{`${title} · Ropewalk`}</title>
      <header className="flex flex-col gap-2 border-b border-rule pb-4">
        <h1 className="text-display font-semibold leading-tight tracking-tight text-ink">{title}</h1>
        {lead && <div className="max-w-prose text-lead text-ink-soft">{lead}</div>}
      </header>
      {children}
    </section>
  );
}

/** A ruled panel for one task on a page (a form, a table). */
export function Panel({ title, children, aside }: { title: string; children: ReactNode; aside?: ReactNode }) {
  return (
    <section className="rounded-lg border border-rule bg-white/50 p-5 shadow-[0_1px_0_var(--color-rule)]">
      <div className="mb-4 flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-title font-semibold text-ink">{title}</h2>
        {aside}
      </div>
      {children}
    </section>
  );
}
