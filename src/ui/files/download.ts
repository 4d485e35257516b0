/** Saving a file from the page: a Blob and a temporary link with `download`. */

export function downloadText(name: string, content: string | Uint8Array, mime: string): void {
  const blob =
    typeof content === "string" ? new Blob([content], { type: `${mime};charset=utf-8` }) : new Blob([content as BlobPart], { type: mime });
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  a.rel = "noopener";
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** A file name from a project title: lower case, dashes, no odd characters. */
export function fileStem(title: string): string {
  const stem = title
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60);
  return stem || "project";
}
