import type { CurrentScaling } from "@shared/schemas/models";

/** The rope_scaling block the config already carries, as read from the file (kept with the profile, not edited here). */
export function CurrentScalingNote({ scaling }: { scaling: CurrentScaling | null | undefined }) {
  if (!scaling)
    return (
      <p className="text-body text-ink-soft">The config carries no rope_scaling block: the model runs plain RoPE.</p>
    );
  return (
    <div className="flex flex-col gap-1">
      <p className="text-body">
        The config already carries scaling: method <strong>{scaling.method}</strong>. The block as written in the file:
      </p>
      <pre className="overflow-x-auto rounded-md border border-rule bg-paper-deep px-3 py-2 text-note">
        {JSON.stringify(scaling.raw, null, 2)}
      </pre>
    </div>
  );
}
