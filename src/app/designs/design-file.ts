/** File name for an exported version: the design's name made safe for any file system, and the version. */
export function exportFileName(designName: string, version: number): string {
  const base = designName
    .normalize('NFKD')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .toLowerCase();
  return `${base || 'design'}-v${version}.json`;
}

/** Offers a design document to the browser as a JSON download. */
export function downloadDocument(document: unknown, fileName: string): void {
  const blob = new Blob([JSON.stringify(document, null, 2) + '\n'], { type: 'application/json' });
  const url = URL.createObjectURL(blob);
  const link = window.document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.click();
  // The click has started the download; the URL is no longer needed once it has been handed over.
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
