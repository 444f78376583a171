// Save a Blob as a file in the browser (CSV export, case file, relay records): an object URL and a temporary link.
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  // Some browsers read the URL after click() returns: release it a little later.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
