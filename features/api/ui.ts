/** What other features may render or hook into from api (needs the app's runtime). */
export { downloadPdf, pdfFileName } from '@/features/api/pdf-download';
export type { PaperSize } from '@/features/api/pdf-download';
export { fileTypeOfName, fileTypes } from '@/features/api/file-types';
export type { FileType } from '@/features/api/file-types';
export { handOverVerb, saveOrShareApiFile, saveOrShareText } from '@/features/api/save-or-share';
export {
  DownloadProgressBar,
  downloadProgressText,
  useDownloadProgress,
} from '@/features/api/download-progress-bar';
export type { DownloadProgress, OnDownloadProgress } from '@/features/api/download-progress';
export { PaperSizeDownload } from '@/features/api/paper-download';
