// Hands a file to the browser's download (bundles, plot images, CSV tables).

/**
 * Saves bytes under a file name through a temporary object URL.
 * @param blob - the content.
 * @param fileName - the suggested name.
 */
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  saveUrl(url, fileName);
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/**
 * Saves what an address holds (an object URL or a `data:` URL) under a file name.
 * @param url - the address.
 * @param fileName - the suggested name.
 */
export function saveUrl(url: string, fileName: string): void {
  const anchor = document.createElement('a');
  anchor.href = url;
  anchor.download = fileName;
  document.body.appendChild(anchor);
  anchor.click();
  anchor.remove();
}

/**
 * A file name made of safe characters only.
 * @param text - any text (a design name, a plot title).
 * @returns letters, digits, dots, dashes and underscores.
 */
export function safeFileName(text: string): string {
  return text.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '') || 'varsmith';
}
