import { useState } from "react";
import type { BudgetRecipeResponse } from "@shared/schemas/budget";
import { Button } from "@/components/button";
import { citation } from "../lib/recipes";

type Props = {
  recipes: BudgetRecipeResponse[];
  caution: string;
  /** Row names to apply a recipe to (plan mode); absent: the recipe is added as a new stage. */
  targets?: string[];
  onPick: (recipe: BudgetRecipeResponse, target: number | null) => void;
};

/** Published starting points, each with its source; picking one fills a stage with what the paper reported. */
export function RecipeMenu({ recipes, caution, targets, onPick }: Props) {
  const [target, setTarget] = useState(0);
  return (
    <details className="rounded-md border border-rule bg-paper-deep/40 px-4 py-2">
      <summary className="cursor-pointer text-body font-medium text-hemp-dark">Start from a published recipe</summary>
      <p className="mt-2 text-note text-ink-soft">{caution}</p>
      {targets && targets.length > 0 && (
        <label className="mt-2 flex items-center gap-2 text-note font-semibold">
          Apply to
          <select
            value={target}
            onChange={(e) => setTarget(Number(e.target.value))}
            className="rounded-md border border-rule-strong bg-white/70 px-2 py-1 text-body font-normal"
          >
            {targets.map((t, i) => (
              <option key={t} value={i}>
                {t}
              </option>
            ))}
          </select>
        </label>
      )}
      <ul className="mt-3 flex flex-col gap-3">
        {recipes.map((r) => (
          <li
            key={r.id}
            className="flex flex-wrap items-start justify-between gap-3 border-t border-rule pt-3 first:border-t-0 first:pt-0"
          >
            <div className="max-w-prose">
              <p className="font-semibold">{r.name}</p>
              <p className="text-note">{r.summary}</p>
              <p className="text-note text-ink-soft">
                Reported by {citation(r)}, <cite>{r.source.title}</cite>
              </p>
            </div>
            <Button
              variant="secondary"
              size="sm"
              onClick={() => onPick(r, targets ? target : null)}
              aria-label={`Use ${r.name}`}
            >
              {targets ? "Apply" : "Add as a stage"}
            </Button>
          </li>
        ))}
      </ul>
    </details>
  );
}
