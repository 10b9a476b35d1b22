// A font file imported by the web build is an asset: Metro hands back its registry number.
declare module '*.woff2' {
  const asset: number;
  export default asset;
}
