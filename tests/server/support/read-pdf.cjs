/**
 * Reads a PDF from stdin with pdf-parse (built on Mozilla's pdf.js) and prints its text and page sizes
 * as JSON. It runs as its own Node process because pdf.js starts its worker with a dynamic import,
 * which jest's module sandbox refuses.
 */
const { Buffer } = require('node:buffer');

const { PDFParse } = require('pdf-parse');

async function main() {
  const chunks = [];
  for await (const chunk of process.stdin) chunks.push(chunk);
  const parser = new PDFParse({ data: new Uint8Array(Buffer.concat(chunks)) });
  try {
    const { text } = await parser.getText();
    const info = await parser.getInfo({ parsePageInfo: true });
    const pages = info.pages.map((p) => ({ width: p.width, height: p.height }));
    process.stdout.write(JSON.stringify({ text, total: info.total, pages }));
  } finally {
    await parser.destroy();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
