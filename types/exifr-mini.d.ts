// exifr's "mini" build (JPEG TIFF/EXIF/GPS only, a third of the full one's size) has the full one's API.
declare module 'exifr/dist/mini.umd.js' {
  export * from 'exifr';
  export { default } from 'exifr';
}
