// drizzle-kit's generated `migrations.js` imports each migration as a string (babel inline-import).
declare module '*.sql' {
  const source: string;
  export default source;
}
