/** A file name safe to show and to send in Content-Disposition: no paths, controls or quotes. */
export function sanitizeFileName(name: string, fallback = 'upload'): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  const clean = base
    .normalize('NFC')
    .replace(/[\u0000-\u001f\u007f"<>:|?*]/g, '')
    .replace(/^\.+/, '')
    .trim()
    .slice(0, 120);
  return clean || fallback;
}
