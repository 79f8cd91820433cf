import { TextField } from "@/components/field";
import { sig, tokens } from "../figures";
import type { FieldErrors } from "../state/to-request";

type WindowInputsProps = {
  target: string;
  alpha: string;
  beta: string;
  trainedContext: number | null;
  onChange: (patch: { target?: string; alpha?: string; beta?: string }) => void;
  errors: FieldErrors;
};

/** Target length L′ and the band thresholds α, β. */
export function WindowInputs({ target, alpha, beta, trainedContext, onChange, errors }: WindowInputsProps) {
  const t = Number(target);
  const scale = trainedContext && t > 0 ? t / trainedContext : null;
  return (
    <div className="flex flex-col gap-3">
      <TextField
        label="Target length L′ (tokens)"
        inputMode="numeric"
        value={target}
        placeholder={trainedContext ? String(trainedContext * 4) : "e.g. 32768"}
        error={errors.targetContext}
        hint={scale !== null ? `s = L′/L = ${sig(scale, 4)} (trained L = ${tokens(trainedContext!)})` : undefined}
        onChange={(e) => onChange({ target: e.target.value })}
      />
      <div className="grid grid-cols-2 gap-3">
        <TextField
          label="Band α (turns)"
          inputMode="decimal"
          placeholder="1"
          value={alpha}
          error={errors["bands.alpha"]}
          onChange={(e) => onChange({ alpha: e.target.value })}
        />
        <TextField
          label="Band β (turns)"
          inputMode="decimal"
          placeholder="32"
          value={beta}
          error={errors["bands.beta"] ?? errors.bands}
          onChange={(e) => onChange({ beta: e.target.value })}
        />
      </div>
    </div>
  );
}
