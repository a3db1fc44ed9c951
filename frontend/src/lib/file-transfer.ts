import { fetchFile } from './api-client';

// The browser's side of files: handing a blob or text to the browser as a download. The requests themselves
// (blobs, uploads with progress, the token and an expired session) are the API client's.

/** Hands a blob to the browser as a download. */
export function saveBlob(blob: Blob, filename: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.rel = 'noopener';
  link.style.display = 'none';
  document.body.appendChild(link);
  link.click();
  link.remove();
  // The download has started from the click; the URL can go once the browser has picked it up.
  window.setTimeout(() => URL.revokeObjectURL(url), 30_000);
}

/** Fetches a file with the token and saves it under the server's name (or the fallback). */
export async function downloadFile(path: string, fallbackName: string): Promise<void> {
  const file = await fetchFile(path);
  saveBlob(file.blob, file.filename ?? fallbackName);
}

/** Text as a file download (CSV reports, exported tables). */
export function saveText(text: string, filename: string, type = 'text/csv;charset=utf-8'): void {
  saveBlob(new Blob([text], { type }), filename);
}
