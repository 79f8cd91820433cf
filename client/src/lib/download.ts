/** Hands text to the browser as a file download (a CSV, a JSON block). */
export function downloadText(text: string, fileName: string, type = "text/csv;charset=utf-8") {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const link = document.createElement("a");
  link.href = url;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  // Revoked on the next turn: the click has already handed the blob to the download.
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
