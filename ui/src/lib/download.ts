/**
 * The one way the ui hands a file to the browser: an invisible link with `download`, clicked once. Blobs
 * go through an object URL that is released once the browser has had time to start the download.
 */
export function saveUrl(url: string, fileName: string): void {
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.rel = 'noopener';
  document.body.appendChild(a);
  a.click();
  a.remove();
}

export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  try {
    saveUrl(url, fileName);
  } finally {
    setTimeout(() => URL.revokeObjectURL(url), 30_000);
  }
}

export function saveText(text: string, fileName: string, type = 'text/plain'): void {
  saveBlob(new Blob([text], { type }), fileName);
}
