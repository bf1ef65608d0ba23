/** A count with thousands separators: 12,345. */
export function formatCount(n: number): string {
  return n.toLocaleString("en");
}

/** Bytes as a person reads them: "512 bytes", "1.5 KB", "20 MB" (binary units). */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${Math.round((bytes / 1024) * 10) / 10} KB`;
  return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;
}
