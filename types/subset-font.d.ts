// subset-font ships no types; this is the part scripts/build-fonts.ts calls.
declare module 'subset-font' {
  type Options = {
    targetFormat?: 'sfnt' | 'truetype' | 'woff' | 'woff2';
    preserveNameIds?: number[];
    keepFeatures?: string[];
    dropTables?: string[];
    noHinting?: boolean;
    noLayoutClosure?: boolean;
  };
  export default function subsetFont(font: Buffer, text: string, options?: Options): Promise<Buffer>;
}
