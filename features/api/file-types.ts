/**
 * The file types the app hands to people, each with its MIME type (what Android's share intent and a
 * browser download go by) and its Apple Uniform Type Identifier (what iOS's share sheet goes by): the
 * system-declared identifiers of Apple's "System-declared uniform type identifiers" list.
 */
export type FileType = { mimeType: string; uti: string };

export const fileTypes = {
  /** RFC 8118 */
  pdf: { mimeType: 'application/pdf', uti: 'com.adobe.pdf' },
  /** RFC 4180 */
  csv: { mimeType: 'text/csv', uti: 'public.comma-separated-values-text' },
  /** RFC 8259 */
  json: { mimeType: 'application/json', uti: 'public.json' },
  /** RFC 2046: bytes of no particular type */
  other: { mimeType: 'application/octet-stream', uti: 'public.data' },
} as const satisfies Record<string, FileType>;

/** The type a file name's extension says ("report.PDF" is a PDF); anything else is plain bytes. */
export function fileTypeOfName(fileName: string): FileType {
  const ext = /\.([a-z0-9]+)$/i.exec(fileName)?.[1]?.toLowerCase();
  return ext === 'pdf' || ext === 'csv' || ext === 'json' ? fileTypes[ext] : fileTypes.other;
}
