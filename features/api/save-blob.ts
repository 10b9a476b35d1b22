/**
 * Hands bytes to the browser as a download from a temporary object URL (web only). Its own module, so
 * what saves a file does not bring the PDF download with it, nor the PDF download the sign-in form.
 */
export function saveBlob(blob: Blob, fileName: string): string {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.rel = 'noopener';
  document.body.appendChild(a);
  a.click();
  a.remove();
  // Give the browser a moment to start the download before the URL goes.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
  return `Downloaded ${fileName}`;
}
