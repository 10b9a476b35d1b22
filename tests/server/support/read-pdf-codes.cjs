/**
 * Reads every QR code printed in a PDF, as a phone would see the paper: each page is drawn to pixels by
 * pdf-parse (Mozilla's pdf.js with @napi-rs/canvas), and jsQR (the `jsqr` npm package, an ISO/IEC 18004
 * decoder of its own) reads each square dark region of the page. Prints JSON: per page, the decoded texts in the order found. Its own Node process, as
 * read-pdf.cjs, because pdf.js starts its worker with a dynamic import that jest's sandbox refuses.
 */
const { Buffer } = require('node:buffer');

const { createCanvas, loadImage } = require('@napi-rs/canvas');
const jsQR = require('jsqr');
const { PDFParse } = require('pdf-parse');

/**
 * Dark regions of the page, as boxes: the page in cells of `cell` pixels, a cell dark when any pixel in it
 * is, and neighbouring dark cells joined. A code's modules touch, so each code is one box (text is boxes
 * too; they simply decode to nothing).
 */
function darkBoxes(data, width, height, cell) {
  const cw = Math.ceil(width / cell);
  const ch = Math.ceil(height / cell);
  const dark = new Uint8Array(cw * ch);
  for (let y = 0; y < height; y++)
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4;
      if (data[i] + data[i + 1] + data[i + 2] < 3 * 100)
        dark[Math.floor(y / cell) * cw + Math.floor(x / cell)] = 1;
    }
  const seen = new Uint8Array(cw * ch);
  const boxes = [];
  for (let start = 0; start < dark.length; start++) {
    if (!dark[start] || seen[start]) continue;
    const box = { x0: cw, y0: ch, x1: 0, y1: 0 };
    const stack = [start];
    seen[start] = 1;
    while (stack.length) {
      const k = stack.pop();
      const cx = k % cw;
      const cy = (k - cx) / cw;
      box.x0 = Math.min(box.x0, cx);
      box.y0 = Math.min(box.y0, cy);
      box.x1 = Math.max(box.x1, cx);
      box.y1 = Math.max(box.y1, cy);
      for (const [dx, dy] of [
        [1, 0],
        [-1, 0],
        [0, 1],
        [0, -1],
      ]) {
        const nx = cx + dx;
        const ny = cy + dy;
        const n = ny * cw + nx;
        if (nx >= 0 && ny >= 0 && nx < cw && ny < ch && dark[n] && !seen[n]) {
          seen[n] = 1;
          stack.push(n);
        }
      }
    }
    boxes.push({
      x: box.x0 * cell,
      y: box.y0 * cell,
      w: (box.x1 - box.x0 + 1) * cell,
      h: (box.y1 - box.y0 + 1) * cell,
    });
  }
  return boxes;
}

async function codesOf(png) {
  const image = await loadImage(png);
  const canvas = createCanvas(image.width, image.height);
  const ctx = canvas.getContext('2d');
  // The page is drawn on a transparent background: put it on white paper first.
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, image.width, image.height);
  ctx.drawImage(image, 0, 0);
  const whole = ctx.getImageData(0, 0, image.width, image.height);
  const found = [];
  // jsQR reads one code per image: each square-ish dark region big enough to be a code, with white around.
  for (const b of darkBoxes(whole.data, image.width, image.height, 6)) {
    if (b.w < 60 || b.h < 60 || Math.abs(b.w - b.h) > 0.2 * b.w) continue;
    const pad = 16;
    const x = Math.max(0, b.x - pad);
    const y = Math.max(0, b.y - pad);
    const w = Math.min(image.width - x, b.w + 2 * pad);
    const h = Math.min(image.height - y, b.h + 2 * pad);
    const crop = ctx.getImageData(x, y, w, h);
    const code = jsQR(crop.data, w, h, { inversionAttempts: 'dontInvert' });
    if (code) found.push(code.data);
  }
  return found;
}

async function main() {
  const chunks = [];
  for await (const chunk of process.stdin) chunks.push(chunk);
  const parser = new PDFParse({ data: new Uint8Array(Buffer.concat(chunks)) });
  try {
    const shots = await parser.getScreenshot({ scale: 2, imageDataUrl: false, imageBuffer: true });
    const pages = [];
    for (const page of shots.pages) pages.push(await codesOf(Buffer.from(page.data)));
    process.stdout.write(JSON.stringify({ pages }));
  } finally {
    await parser.destroy();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
