import { createColumnHelper } from "@tanstack/react-table";
import type { PairResult } from "@shared/schemas/analysis";
import { BAND_STYLE, FLAG_IDS, FLAG_STYLE } from "../charts/palette";
import { sig } from "../figures";

const column = createColumnHelper<PairResult>();

export const anyFlag = (p: PairResult) => FLAG_IDS.some((f) => p[f]);

/** Shown with 4 significant figures; the CSV keeps the accessor's full-precision value. */
const numeric = (digits = 4) => ({
  cell: (c: { getValue: () => unknown }) => <span className="tabular-nums">{sig(Number(c.getValue()), digits)}</span>,
  sortDescFirst: false,
});

/** Headers are plain strings: the CSV reuses them as its header row. */
export const PAIR_COLUMNS = [
  column.accessor("index", {
    header: "Pair i",
    cell: (c) => <span className="tabular-nums">{c.getValue()}</span>,
    enableHiding: false,
  }),
  column.accessor((p) => BAND_STYLE[p.band].label, {
    id: "band",
    header: "Band",
    cell: (c) => (
      <span
        className="rounded px-1.5 py-0.5 text-note font-medium"
        style={{ background: BAND_STYLE[c.row.original.band].wash, color: BAND_STYLE[c.row.original.band].text }}
      >
        {c.getValue()}
      </span>
    ),
  }),
  column.accessor("wavelength", { header: "λ (tokens)", ...numeric() }),
  column.accessor("scaledWavelength", { header: "λ′ (tokens)", ...numeric() }),
  column.accessor("rotationsInTrainedWindow", { header: "r = L/λ (turns)", ...numeric() }),
  column.accessor("invFreq", { header: "θ (rad/token)", ...numeric() }),
  column.accessor("scaledInvFreq", { header: "θ′ (rad/token)", ...numeric() }),
  column.accessor((p) => p.scaledInvFreq / p.invFreq, { id: "ratio", header: "θ′/θ", ...numeric() }),
  column.accessor(
    (p) =>
      FLAG_IDS.filter((f) => p[f])
        .map((f) => FLAG_STYLE[f].label)
        .join("; "),
    {
      id: "flags",
      header: "Flags",
      cell: (c) => {
        const flags = FLAG_IDS.filter((f) => c.row.original[f]);
        if (!flags.length) return <span className="text-ink-soft">—</span>;
        return (
          <span className="flex flex-col gap-0.5">
            {flags.map((f) => (
              <span key={f} className="text-note font-medium" style={{ color: FLAG_STYLE[f].colour }}>
                {FLAG_STYLE[f].label}
              </span>
            ))}
          </span>
        );
      },
    },
  ),
];
