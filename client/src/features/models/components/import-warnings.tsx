import type { ImportWarning } from "@shared/schemas/models";

type ImportWarningsProps = {
  warnings: ImportWarning[];
  /** Where the original config.json can be downloaded, when the profile kept it. */
  sourceHref?: string;
  sourceFileName?: string | null;
  /** Heading above the list; null when the page already says what the list is. */
  title?: string | null;
  /** Two columns where the list sits in a wide panel. */
  columns?: 1 | 2;
};

/** Every warning the config import raised, each with what it means and what to do, in plain words. */
export function ImportWarnings({
  warnings,
  sourceHref,
  sourceFileName,
  title = "What the config file got wrong, or may have",
  columns = 1,
}: ImportWarningsProps) {
  return (
    <section aria-label="Import warnings" className="flex flex-col gap-3" data-testid="import-warnings">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        {title !== null && (
          <h3 className="text-lead font-semibold text-ink">
            {title}{" "}
            <span className="text-body font-normal text-ink-soft">
              ({warnings.length === 0 ? "none" : warnings.length})
            </span>
          </h3>
        )}
        {sourceHref && (
          <a
            href={sourceHref}
            download={sourceFileName ?? "config.json"}
            className="text-body font-medium underline underline-offset-4"
          >
            Download the original {sourceFileName ?? "config.json"}
          </a>
        )}
      </div>
      {warnings.length === 0 ? (
        <p className="text-body text-ink-soft">The import raised no warnings.</p>
      ) : (
        <ol className={columns === 2 ? "grid gap-2 lg:grid-cols-2" : "flex flex-col gap-2"}>
          {warnings.map((w, i) => (
            <li
              key={`${w.code}-${i}`}
              className="rounded-md border border-hemp/30 border-l-4 border-l-hemp bg-hemp-pale/40 px-4 py-2"
              data-code={w.code}
            >
              <p className="text-body text-ink">{w.message}</p>
              <p className="mt-1 text-body text-ink-soft">
                <span className="font-semibold text-hemp-dark">What to do: </span>
                {w.fix}
              </p>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
