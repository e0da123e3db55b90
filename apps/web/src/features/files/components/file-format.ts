/** "256 KiB", "1.5 MiB": binary units, as file sizes are shown in the trade's tools. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${Number((bytes / 1024).toFixed(1))} KiB`;
  return `${Number((bytes / 1048576).toFixed(1))} MiB`;
}

/** An address as 0x-prefixed hex, at least eight digits, so columns line up. */
export const hexAddress = (address: number): string => `0x${address.toString(16).toUpperCase().padStart(8, '0')}`;

export const hexByte = (byte: number | null): string => (byte === null ? '··' : byte.toString(16).toUpperCase().padStart(2, '0'));

export const formatShare = (share: number): string => `${(share * 100).toFixed(share > 0 && share < 0.001 ? 4 : 2)} %`;
