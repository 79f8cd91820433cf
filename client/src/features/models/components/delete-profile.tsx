import { useState } from "react";
import type { ModelProfile } from "@shared/schemas/models";
import { Button } from "@/components/button";
import { Notice } from "@/components/notice";
import { useDeleteModel, useRestoreModel } from "../api/delete-model";

/**
 * Delete after a second click. A profile that plans use is retired by the server instead (it leaves the pickers and
 * the plans keep working), and the plans are named; a retired profile offers Restore.
 */
export function DeleteProfile({ model, onDeleted }: { model: ModelProfile; onDeleted: () => void }) {
  const remove = useDeleteModel();
  const restore = useRestoreModel();
  const [confirming, setConfirming] = useState(false);
  const usedBy = remove.data?.usedBy;

  return (
    <div className="flex flex-col gap-3">
      {usedBy && (
        <Notice tone="success" title="Retired, not deleted">
          <p>
            {usedBy.map((p) => `#${p.id} ${p.title}`).join("; ")} {usedBy.length === 1 ? "uses" : "use"} this profile.
          </p>
          <p className="mt-1">
            It no longer appears where a profile is picked; those plans keep working on it, and Restore offers it again.
          </p>
        </Notice>
      )}
      {(remove.isError || restore.isError) && (
        <Notice tone="alert" title="Could not change the profile">
          {(remove.error ?? restore.error)?.message}
        </Notice>
      )}
      {model.retiredAt ? (
        <div className="flex flex-wrap items-center gap-2">
          <span className="text-body">
            Retired on {new Date(model.retiredAt).toLocaleDateString()}: hidden from pickers.
          </span>
          <Button
            variant="secondary"
            size="sm"
            busy={restore.isPending}
            onClick={() => {
              remove.reset();
              restore.mutate(model.id);
            }}
          >
            Restore profile
          </Button>
        </div>
      ) : confirming ? (
        <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Confirm deletion">
          <span className="text-body">Delete {model.name}? If plans use it, it is retired instead.</span>
          <Button
            variant="danger"
            size="sm"
            busy={remove.isPending}
            onClick={() =>
              remove.mutate(model.id, {
                onSuccess: (retired) => {
                  if (!retired) onDeleted();
                },
                onSettled: () => setConfirming(false),
              })
            }
          >
            Yes, delete it
          </Button>
          <Button variant="secondary" size="sm" onClick={() => setConfirming(false)}>
            Keep it
          </Button>
        </div>
      ) : (
        <div>
          <Button
            variant="danger"
            onClick={() => {
              remove.reset();
              restore.reset();
              setConfirming(true);
            }}
          >
            Delete profile
          </Button>
        </div>
      )}
    </div>
  );
}
