/**
 * Hands a text file to the person: on the web, a download through a temporary Blob link (the file never
 * leaves the page, so it works offline and needs no second request with the session token).
 */
export async function saveTextFile(name: string, text: string, mimeType: string): Promise<string> {
  const url = URL.createObjectURL(new Blob([text], { type: mimeType }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.rel = 'noopener';
  document.body.appendChild(a);
  a.click();
  a.remove();
  // Give the browser a moment to start the download before the URL goes.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
  return `Downloaded ${name}`;
}
