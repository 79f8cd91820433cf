import Papa from "papaparse";
import type { Table } from "@tanstack/react-table";

/** The table exactly as shown (filtered, sorted, visible columns) as CSV text, values at full precision. */
export function tableToCsv<T>(table: Table<T>): string {
  const columns = table.getVisibleLeafColumns();
  const fields = columns.map((c) => String(c.columnDef.header));
  const data = table.getRowModel().rows.map((row) => columns.map((c) => row.getValue(c.id)));
  return Papa.unparse({ fields, data });
}
