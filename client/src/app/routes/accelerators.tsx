import { useQuery } from "@tanstack/react-query";
import { Page } from "@/components/page";
import { currencyQuery } from "@/features/budgets/api/currency";
import { ManageAccelerators } from "@/features/accelerators/components/manage-accelerators";
import { CurrencySetting } from "@/features/budgets/components/currency-setting";
import { useCurrentUser } from "@/features/auth/hooks/use-session";

/** Who may change the catalog; the server enforces the same rule on every write. */
const KEEPERS = ["infra", "admin"] as const;

export function AcceleratorsRoute() {
  const user = useCurrentUser();
  const canEdit = user.roles.some((r) => (KEEPERS as readonly string[]).includes(r));
  // The currency is a workspace setting: admins only (the server checks the same).
  const isAdmin = user.roles.includes("admin");
  const currency = useQuery(currencyQuery()).data?.currency;
  return (
    <Page
      title="Accelerators"
      lead={
        <>
          The hardware a budget can be costed on: memory, dense peak FLOP/s at the training precision, and price per
          hour.
          {canEdit
            ? " Changes apply to drafts from their next edit; submitted plans keep the figures they were costed with."
            : " Infra leads and admins keep this list."}
        </>
      }
    >
      <div className="flex flex-col gap-5">
        <CurrencySetting canEdit={isAdmin} />
        <ManageAccelerators canEdit={canEdit} currency={currency} />
      </div>
    </Page>
  );
}
