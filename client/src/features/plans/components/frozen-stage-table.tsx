import type { ReactNode } from "react";
import { formatCount, formatHours, formatScientific } from "@/lib/format";
import { FramedTable } from "@/components/framed-table";

const cell = "px-3 py-2";

/** The figures every budget model freezes per stage and in total; each model's schema stays its own. */
type Figures = { tokens: number; flops: number; acceleratorHours: number; wallClockHours: number; cost: number };
type Stage = Figures & { index: number; fits: boolean };

/** The column heads that differ between budget models (links to conventions, the currency in the cost head). */
type Heads = Record<"tokens" | "flops" | "acceleratorHours" | "cost" | "memory" | "fits", ReactNode>;

type FrozenStageTableProps<S extends Stage> = {
  stages: S[];
  totals: Figures;
  heads: Heads;
  money: (value: number) => string;
  /** The memory cell of a stage: a total, and in later models its terms. */
  memory: (stage: S) => ReactNode;
  /** Under "does not fit": what would make the stage fit, in the model's own terms. */
  fitHint: (stage: S) => ReactNode;
};

/** A frozen budget's per-stage figures and totals, shown as signed: the table both budget panels share. */
export function FrozenStageTable<S extends Stage>({
  stages,
  totals,
  heads,
  money,
  memory,
  fitHint,
}: FrozenStageTableProps<S>) {
  return (
    <FramedTable
      caption="Budget per stage"
      head={
        <>
          <th scope="col">Stage</th>
          <th scope="col">{heads.tokens}</th>
          <th scope="col">{heads.flops}</th>
          <th scope="col">{heads.acceleratorHours}</th>
          <th scope="col">Wall clock</th>
          <th scope="col">{heads.cost}</th>
          <th scope="col">{heads.memory}</th>
          <th scope="col">{heads.fits}</th>
        </>
      }
      foot={
        <tr>
          <th scope="row" className={cell}>
            Total
          </th>
          <td className={cell}>{formatCount(totals.tokens)}</td>
          <td className={cell}>{formatScientific(totals.flops)}</td>
          <td className={cell}>{formatHours(totals.acceleratorHours)}</td>
          <td className={cell}>{formatHours(totals.wallClockHours)}</td>
          <td className={cell}>{money(totals.cost)}</td>
          <td className={cell} colSpan={2} />
        </tr>
      }
    >
      {stages.map((s) => (
        <tr key={s.index} className="border-t border-rule/70 align-top">
          <th scope="row" className={`${cell} font-medium`}>
            {s.index + 1}
          </th>
          <td className={cell}>{formatCount(s.tokens)}</td>
          <td className={cell}>{formatScientific(s.flops)}</td>
          <td className={cell}>{formatHours(s.acceleratorHours)}</td>
          <td className={cell}>{formatHours(s.wallClockHours)}</td>
          <td className={cell}>{money(s.cost)}</td>
          <td className={cell}>{memory(s)}</td>
          <td className={cell}>
            {s.fits ? (
              <span className="text-seaglass-dark">fits</span>
            ) : (
              <span className="font-semibold text-signal-dark">does not fit</span>
            )}
            {!s.fits && fitHint(s)}
          </td>
        </tr>
      ))}
    </FramedTable>
  );
}
