import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { Controller, useForm } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { createColumnHelper } from "@tanstack/react-table";
import { createTokenRequestSchema, DEFAULT_TOKEN_SCOPES, type ApiToken } from "@shared/schemas/tokens";
import { Button, SubmitButton } from "@/components/button";
import { DataTable } from "@/components/data-table";
import { TextField } from "@/components/field";
import { Chip, Loading, Notice } from "@/components/notice";
import { formatDateTime } from "@/lib/format";
import { applyApiErrors } from "@/lib/form-errors";
import { useCreateToken } from "../api/create-token";
import { tokensQueries } from "../api/queries";
import { useRevokeToken } from "../api/revoke-token";
import { NewTokenSecret } from "./new-token-secret";
import { ScopeCheckboxes } from "./scope-checkboxes";

const column = createColumnHelper<ApiToken>();

/** Personal API tokens: make one with its scopes (its secret shown once), see when each was last used, revoke. */
export function TokenManager() {
  const tokens = useQuery(tokensQueries.list());
  const create = useCreateToken();
  const revoke = useRevokeToken();
  const [fresh, setFresh] = useState<{ name: string; token: string } | null>(null);
  const [message, setMessage] = useState<{ tone: "success" | "alert"; text: string } | null>(null);
  const { register, control, handleSubmit, setError, reset, formState } = useForm({
    resolver: formResolver(createTokenRequestSchema),
    defaultValues: { name: "", scopes: DEFAULT_TOKEN_SCOPES },
  });

  const onSubmit = handleSubmit((values) => {
    setMessage(null);
    create.mutate(values, {
      onSuccess: (t) => {
        reset();
        setFresh({ name: t.name, token: t.token });
      },
      onError: (e) => {
        const text = applyApiErrors(e, setError, ["name", "scopes"]);
        if (text) setMessage({ tone: "alert", text });
      },
    });
  });

  const columns = [
    column.accessor("name", { header: "Name", cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
    column.accessor("prefix", { header: "Starts with", cell: (c) => <code>{c.getValue()}…</code> }),
    column.accessor((t) => t.scopes.join(" "), {
      id: "scopes",
      header: "Scopes",
      cell: (c) => (
        <span className="flex flex-wrap gap-1">
          {c.row.original.scopes.map((s) => (
            <Chip key={s} tone="muted">
              <code>{s}</code>
            </Chip>
          ))}
        </span>
      ),
    }),
    column.accessor("createdAt", {
      header: "Created",
      cell: (c) => formatDateTime(c.getValue()),
      enableGlobalFilter: false,
    }),
    column.accessor("lastUsedAt", {
      header: "Last used",
      cell: (c) => (c.getValue() ? formatDateTime(c.getValue()!) : "never"),
      enableGlobalFilter: false,
    }),
    column.accessor((t) => (t.revokedAt ? "Revoked" : "Active"), {
      id: "status",
      header: "Status",
      cell: (c) => (
        <Chip tone={c.row.original.revokedAt ? "muted" : "seaglass"}>
          {c.getValue()}
          {c.row.original.revokedAt && ` ${formatDateTime(c.row.original.revokedAt)}`}
        </Chip>
      ),
    }),
    column.display({
      id: "actions",
      header: () => <span className="sr-only">Actions</span>,
      cell: ({ row: { original: t } }) =>
        t.revokedAt ? null : (
          <Button
            variant="danger"
            size="sm"
            busy={revoke.isPending && revoke.variables === t.id}
            aria-label={`Revoke ${t.name}`}
            onClick={() => {
              setMessage(null);
              revoke.mutate(t.id, {
                onSuccess: () =>
                  setMessage({
                    tone: "success",
                    text: `${t.name} is revoked; requests with it are refused from now on.`,
                  }),
                onError: (e) => setMessage({ tone: "alert", text: e.message }),
              });
            }}
          >
            Revoke
          </Button>
        ),
    }),
  ];

  return (
    <div className="flex flex-col gap-4">
      {fresh && <NewTokenSecret name={fresh.name} token={fresh.token} onDismiss={() => setFresh(null)} />}
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      <form onSubmit={onSubmit} noValidate aria-label="New API token" className="flex flex-col gap-3">
        <div className="flex flex-wrap items-end gap-3">
          <div className="min-w-64 flex-1">
            <TextField
              label="Token name"
              hint="Where it will be used, e.g. “training cluster export”"
              error={formState.errors.name?.message}
              {...register("name")}
            />
          </div>
          <SubmitButton busy={create.isPending} busyLabel="Creating…">
            Create token
          </SubmitButton>
        </div>
        <Controller
          control={control}
          name="scopes"
          render={({ field, fieldState }) => (
            <ScopeCheckboxes value={field.value ?? []} onChange={field.onChange} error={fieldState.error?.message} />
          )}
        />
      </form>
      {tokens.isPending && <Loading label="Loading tokens…" />}
      {tokens.isError && (
        <Notice tone="alert" title="Could not load your tokens">
          {tokens.error.message}
        </Notice>
      )}
      {tokens.data && (
        <DataTable
          data={tokens.data}
          columns={columns}
          caption="API tokens"
          getRowId={(t) => String(t.id)}
          filterPlaceholder="Type a token name"
          emptyText="No tokens yet."
        />
      )}
    </div>
  );
}
