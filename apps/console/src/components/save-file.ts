// Hands a downloaded Blob to the browser as a file to save (a temporary object URL on a link).
export function saveFile(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.rel = 'noopener';
  link.style.display = 'none';
  document.body.append(link);
  link.click();
  link.remove();
  // some browsers read the URL after the click returns
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
