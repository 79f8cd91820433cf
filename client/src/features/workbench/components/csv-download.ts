import Papa from "papaparse";
import type { Table } from "@tanstack/react-table";

/** The table exactly as shown (filtered, sorted, visible columns) as CSV text, values at full precision. */
export function tableToCsv<T>(table: Table<T>): string {
  const columns = table.getVisibleLeafColumns();
  const fields = columns.map((c) => String(c.columnDef.header));
  const data = table.getRowModel().rows.map((row) => columns.map((c) => row.getValue(c.id)));
  return Papa.unparse({ fields, data });
}

/** Hands text to the browser as a file download. */
export function downloadText(text: string, fileName: string, type = "text/csv;charset=utf-8") {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement("a");
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
