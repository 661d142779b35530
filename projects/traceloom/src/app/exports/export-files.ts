/**
 * Downloads from the screens: the texts come from `@traceloom/shared/format` (the same CSV and
 * LaTeX as the CLI and the server); this file only names and hands them to the browser.
 */

/** Pretty JSON with a final newline. */
export function toJson(value: unknown): string {
  return `${JSON.stringify(value, null, 2)}\n`;
}

/** A file name made of safe characters from a title (`harmonic trap` -> `harmonic-trap`). */
export function fileStem(title: string): string {
  const stem = title
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');
  return stem || 'traceloom';
}

/** Hands `text` to the browser as a file download named `filename`. */
export function downloadText(text: string, filename: string, type: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
