import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { Button } from "@/components/button";
import { TextField } from "@/components/field";
import { isApiError } from "@/lib/api-client";
import { currencyQuery, useSaveCurrency } from "../api/currency";

/**
 * The workspace currency: shown to everyone beside the catalog, changed by an admin. Submitted plans keep the
 * currency they were costed in; drafts and estimates take the new one.
 */
export function CurrencySetting({ canEdit }: { canEdit: boolean }) {
  const current = useQuery(currencyQuery());
  const save = useSaveCurrency();
  const [typed, setTyped] = useState<string | null>(null);
  const value = typed ?? current.data?.currency ?? "";
  const error = isApiError(save.error) ? (save.error.fields?.currency ?? save.error.message) : undefined;
  if (!canEdit)
    return (
      <p className="text-body" data-testid="workspace-currency">
        Prices and costs are in <span className="font-semibold">{current.data?.currency ?? "…"}</span>, the workspace
        currency.
      </p>
    );
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      aria-label="Workspace currency"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate(value.trim().toUpperCase(), { onSuccess: () => setTyped(null) });
      }}
    >
      <TextField
        label="Workspace currency"
        hint="ISO 4217 code, e.g. EUR; every price and cost is in it. Submitted plans keep theirs."
        value={value}
        maxLength={3}
        error={error}
        onChange={(e) => setTyped(e.target.value)}
      />
      <Button type="submit" size="sm" disabled={save.isPending || typed === null}>
        Save currency
      </Button>
    </form>
  );
}
