// fontkit (pdfkit's font engine) ships no types; tests/lint/web-fonts.test.ts types the parts it reads.
declare module 'fontkit' {
  export function openSync(path: string): unknown;
}
