// qrcode ships no types; this is the part server/notices/pdf/chain-mark.ts calls (QR matrix only).
declare module 'qrcode' {
  type QRCode = { modules: { size: number; data: Uint8Array; get(row: number, col: number): number } };
  export function create(text: string, options?: { errorCorrectionLevel?: 'L' | 'M' | 'Q' | 'H' }): QRCode;
}
