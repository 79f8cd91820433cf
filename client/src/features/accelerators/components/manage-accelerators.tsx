import { useCallback, useState } from "react";
import { useQuery } from "@tanstack/react-query";
import type { Accelerator } from "@shared/schemas/budget";
import { Loading, Notice } from "@/components/notice";
import { Panel } from "@/components/page";
import { acceleratorsQuery } from "../api/list-accelerators";
import { useDeleteAccelerator, useRestoreAccelerator } from "../api/save-accelerator";
import { AcceleratorForm } from "./accelerator-form";
import { AcceleratorsTable } from "./accelerators-table";

type Message = { tone: "success" | "alert"; text: string };

/** The catalog page's body: everyone reads; infra leads and admins add, edit and delete. */
export function ManageAccelerators({ canEdit, currency }: { canEdit: boolean; currency?: string }) {
  const list = useQuery(acceleratorsQuery());
  const remove = useDeleteAccelerator();
  const restore = useRestoreAccelerator();
  const [editing, setEditing] = useState<Accelerator | null>(null);
  const [confirming, setConfirming] = useState<Accelerator | null>(null);
  const [message, setMessage] = useState<Message | null>(null);
  // Remounts the add form after a save so it starts empty again.
  const [formKey, setFormKey] = useState(0);

  const onEdit = useCallback((a: Accelerator) => {
    setMessage(null);
    setEditing(a);
  }, []);
  const onDelete = useCallback((a: Accelerator) => {
    setMessage(null);
    setConfirming(a);
  }, []);

  const onRestore = (a: Accelerator) =>
    restore.mutate(a.id, {
      onSuccess: () => setMessage({ tone: "success", text: `${a.name} is back in the catalog and the pickers.` }),
      onError: (e) => setMessage({ tone: "alert", text: e.message }),
    });

  if (list.isPending) return <Loading label="Loading the catalog…" />;
  if (list.isError)
    return (
      <Notice tone="alert" title="Could not load the catalog">
        {list.error.message}
      </Notice>
    );

  const done = (text: string) => {
    setMessage({ tone: "success", text });
    setEditing(null);
    setFormKey((k) => k + 1);
  };
  const confirmDelete = (a: Accelerator) =>
    remove.mutate(a.id, {
      onSuccess: (retired) =>
        setMessage({
          tone: "success",
          text: retired
            ? `${a.name} is retired, not deleted: ${retired.usedBy.map((p) => `#${p.id} ${p.title}`).join("; ")} ${retired.usedBy.length === 1 ? "was" : "were"} costed on it. It leaves the pickers; those plans keep their figures, and a new draft from them asks for another accelerator.`
            : `Deleted ${a.name}.`,
        }),
      onError: (e) => setMessage({ tone: "alert", text: e.message }),
      onSettled: () => setConfirming(null),
    });

  return (
    <div className="flex flex-col gap-6">
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      {canEdit && (
        <Panel title={editing ? `Edit ${editing.name}` : "Add an accelerator"}>
          <AcceleratorForm
            key={editing ? `edit-${editing.id}` : `new-${formKey}`}
            editing={editing ?? undefined}
            onDone={done}
            onCancel={editing ? () => setEditing(null) : undefined}
          />
        </Panel>
      )}
      <Panel title="Catalog">
        <AcceleratorsTable
          accelerators={list.data.filter((a) => !a.retiredAt)}
          canEdit={canEdit}
          currency={currency}
          busyId={remove.isPending ? (remove.variables ?? null) : null}
          onEdit={onEdit}
          onDelete={onDelete}
          confirming={
            confirming && {
              id: confirming.id,
              busy: remove.isPending,
              onConfirm: () => confirmDelete(confirming),
              onCancel: () => setConfirming(null),
            }
          }
        />
      </Panel>
      {list.data.some((a) => a.retiredAt) && (
        <Panel title="Retired">
          <p className="mb-3 text-body text-ink-soft">
            Plans were costed on these; they are no longer offered for new budgets, and the plans keep their figures.
          </p>
          <AcceleratorsTable
            accelerators={list.data.filter((a) => a.retiredAt)}
            canEdit={canEdit}
            currency={currency}
            busyId={restore.isPending ? (restore.variables ?? null) : null}
            onEdit={onEdit}
            onDelete={onDelete}
            onRestore={onRestore}
          />
        </Panel>
      )}
    </div>
  );
}
