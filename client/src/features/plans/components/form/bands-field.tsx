import { useState } from "react";
import { useFormContext } from "react-hook-form";
import { DEFAULT_BANDS } from "@shared/schemas/analysis";
import { TextField } from "@/components/field";
import type { RevisionForm } from "@/features/plans/lib/form-values";
import { useFieldError } from "./form-field";

/**
 * The two band edges (rotations inside the trained window) are one optional object: both empty means the
 * engine's defaults, so the value is set as a whole rather than as two registered inputs.
 */
export function BandsField() {
  const { getValues, setValue } = useFormContext<RevisionForm>();
  const start = getValues("revision.bands");
  const [alpha, setAlpha] = useState(start ? String(start.alpha) : "");
  const [beta, setBeta] = useState(start ? String(start.beta) : "");
  const alphaError = useFieldError("revision.bands.alpha");
  const betaOwnError = useFieldError("revision.bands.beta");
  const bandsError = useFieldError("revision.bands");
  const betaError = betaOwnError ?? bandsError;
  const commit = (a: string, b: string) => {
    const value =
      a.trim() === "" && b.trim() === ""
        ? undefined
        : { alpha: Number(a || DEFAULT_BANDS.alpha), beta: Number(b || DEFAULT_BANDS.beta) };
    setValue("revision.bands", value, { shouldDirty: true });
  };
  return (
    <div className="grid gap-3 sm:grid-cols-2">
      <TextField
        label="Slow edge α (rotations, optional)"
        hint={`Pairs turning fewer times than this in the trained window count as drifting. Default ${DEFAULT_BANDS.alpha}.`}
        inputMode="decimal"
        value={alpha}
        error={alphaError}
        onChange={(e) => {
          setAlpha(e.target.value);
          commit(e.target.value, beta);
        }}
      />
      <TextField
        label="Fast edge β (rotations, optional)"
        hint={`Pairs turning at least this often count as spinning. Default ${DEFAULT_BANDS.beta}.`}
        inputMode="decimal"
        value={beta}
        error={betaError}
        onChange={(e) => {
          setBeta(e.target.value);
          commit(alpha, e.target.value);
        }}
      />
    </div>
  );
}
