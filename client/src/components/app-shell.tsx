import type { ReactNode } from "react";
import { Link } from "react-router-dom";

export const FOOTER_NOTE =
  "Figures are estimates; a plan is confirmed only by long-context evaluations of the tuned model.";

/**
 * The frame of every screen: the header band with the word mark and the twisted-strand stripe,
 * an optional navigation strand, the page, and the footer line.
 */
export function AppShell({
  homeHref,
  account,
  nav,
  children,
}: {
  homeHref: string;
  account?: ReactNode;
  nav?: ReactNode;
  children: ReactNode;
}) {
  return (
    <div className="flex min-h-screen flex-col bg-paper font-sans text-ink">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:rounded focus:bg-paper focus:px-3 focus:py-1"
      >
        Skip to content
      </a>
      <header className="bg-ink text-paper">
        <div className="mx-auto flex max-w-6xl items-center justify-between gap-4 px-6 py-4">
          <Link to={homeHref} className="flex items-baseline gap-3 no-underline">
            <span className="text-title font-semibold tracking-[0.08em] text-paper">Ropewalk</span>
            <span className="hidden text-note text-paper/70 sm:inline">RoPE rescaling plans, laid and signed</span>
          </Link>
          {account}
        </div>
        <div className="strand-stripe" aria-hidden />
      </header>
      {nav && (
        <div className="border-b border-rule bg-paper-deep/60">
          <div className="mx-auto max-w-6xl px-6 py-2">{nav}</div>
        </div>
      )}
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-6 py-8">
        {children}
      </main>
      <footer className="border-t border-rule">
        <p className="mx-auto max-w-6xl px-6 py-4 text-note text-ink-soft">{FOOTER_NOTE}</p>
      </footer>
    </div>
  );
}
