import { Link } from "react-router-dom";
import { createColumnHelper } from "@tanstack/react-table";
import type { ModelProfile } from "@shared/schemas/models";
import { DataTable } from "@/components/data-table";
import { Chip } from "@/components/notice";
import { paths } from "@/config/paths";
import { formatCount } from "@/lib/format";

const column = createColumnHelper<ModelProfile>();

const num = (header: string, hint?: string) => ({
  header: () => <span title={hint}>{header}</span>,
  enableGlobalFilter: false,
  cell: (c: { getValue: () => unknown }) => <span className="tabular-nums">{formatCount(Number(c.getValue()))}</span>,
  sortDescFirst: false,
});

const columns = [
  column.accessor("name", {
    header: "Name",
    cell: (c) => (
      <span className="flex flex-wrap items-center gap-1">
        <Link to={paths.model(c.row.original.id)} className="font-medium underline-offset-4 hover:underline">
          {c.getValue()}
        </Link>
        {c.row.original.retiredAt && <Chip tone="muted">retired</Chip>}
      </span>
    ),
  }),
  column.accessor("family", { header: "Family" }),
  column.accessor("rotaryDim", num("d", "rotary dimension = head_dim × partial_rotary_factor")),
  column.accessor("ropeTheta", num("Base b", "rope_theta")),
  column.accessor("trainedContext", num("Trained L (tokens)", "the pre-extension context length")),
  column.accessor("kvHeads", num("KV heads")),
  column.accessor("layers", num("Layers")),
  column.accessor("parameters", num("Parameters", "non-embedding parameter count")),
  column.accessor((m) => (m.sourceFileName ? "config file" : "typed in"), {
    id: "source",
    header: "Source",
    cell: (c) => {
      const warnings = c.row.original.importWarnings.length;
      return c.row.original.sourceFileName ? (
        <span className="flex flex-wrap items-center gap-1">
          <Chip tone="seaglass">config file</Chip>
          {warnings > 0 && (
            <Chip>
              {warnings} {warnings === 1 ? "warning" : "warnings"}
            </Chip>
          )}
        </span>
      ) : (
        <Chip tone="muted">typed in</Chip>
      );
    },
  }),
];

/** Every saved profile; sort by any column, filter by name, family or source. */
export function ModelsTable({ models }: { models: ModelProfile[] }) {
  return (
    <DataTable
      data={models}
      columns={columns}
      caption="Model profiles"
      getRowId={(m) => String(m.id)}
      initialSorting={[{ id: "name", desc: false }]}
      emptyText="No profiles yet. Import a config.json or type one in."
      filterPlaceholder="Type a name, family or source"
    />
  );
}
