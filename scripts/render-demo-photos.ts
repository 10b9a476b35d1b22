/**
 * Draws the demo's inspection photos (invented drawings of worn parts, no real photographs) and renders
 * them to JPEG in assets/demo/ with Debian's chromium. Run by hand when a drawing changes:
 *
 *   npx tsx scripts/render-demo-photos.ts
 *
 * The JPEGs are committed; the server never runs this.
 */
import fs from 'node:fs';
import path from 'node:path';

import { chromium } from 'playwright-core';

import { launchOptions } from '@/scripts/browser';
import { repoRoot } from '@/server/paths';
import { demoPhotoFiles, type DemoPhotoFile } from '@/server/seed/demo-photos';

const W = 960;
const H = 720;

/** Grain and uneven light, so a drawing reads like a photo taken on site with a phone. */
const defs = (seed: number) => `
  <filter id="grain" x="0" y="0" width="100%" height="100%">
    <feTurbulence type="fractalNoise" baseFrequency="0.9" numOctaves="2" seed="${seed}" result="n"/>
    <feColorMatrix in="n" type="saturate" values="0" result="g"/>
    <feComponentTransfer in="g" result="g2"><feFuncA type="linear" slope="0.22"/></feComponentTransfer>
    <feComposite in="g2" in2="SourceGraphic" operator="over"/>
  </filter>
  <filter id="rough"><feTurbulence type="turbulence" baseFrequency="0.02 0.3" numOctaves="3" seed="${seed + 3}"/>
    <feDisplacementMap in="SourceGraphic" scale="6"/></filter>
  <radialGradient id="vignette" cx="50%" cy="45%" r="75%">
    <stop offset="60%" stop-color="#000" stop-opacity="0"/><stop offset="100%" stop-color="#000" stop-opacity="0.55"/>
  </radialGradient>
  <linearGradient id="steel" x1="0" y1="0" x2="0" y2="1">
    <stop offset="0" stop-color="#5d646b"/><stop offset="0.18" stop-color="#c9d0d6"/>
    <stop offset="0.35" stop-color="#8d959c"/><stop offset="0.7" stop-color="#50575e"/>
    <stop offset="1" stop-color="#2c3136"/>
  </linearGradient>
  <linearGradient id="polished" x1="0" y1="0" x2="0" y2="1">
    <stop offset="0" stop-color="#7b8085"/><stop offset="0.2" stop-color="#f1f3f4"/>
    <stop offset="0.4" stop-color="#aeb4b8"/><stop offset="0.75" stop-color="#6c7277"/>
    <stop offset="1" stop-color="#3b4045"/>
  </linearGradient>
  <linearGradient id="paint" x1="0" y1="0" x2="0" y2="1">
    <stop offset="0" stop-color="#2f5d8a"/><stop offset="1" stop-color="#1b3550"/>
  </linearGradient>
  <radialGradient id="bore" cx="50%" cy="50%" r="50%">
    <stop offset="0" stop-color="#15181b"/><stop offset="0.75" stop-color="#30363b"/>
    <stop offset="0.93" stop-color="#9aa1a6"/><stop offset="1" stop-color="#c8b27a"/>
  </radialGradient>
  <radialGradient id="bronze" cx="50%" cy="50%" r="50%">
    <stop offset="0.6" stop-color="#b08d4a"/><stop offset="0.85" stop-color="#8a6a30"/>
    <stop offset="1" stop-color="#5e461c"/>
  </radialGradient>`;

const frame = (seed: number, background: string, body: string, label: string) => `
<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">
  <defs>${defs(seed)}</defs>
  <g filter="url(#grain)">
    <rect width="${W}" height="${H}" fill="${background}"/>
    ${body}
    <rect width="${W}" height="${H}" fill="url(#vignette)"/>
  </g>
  <g font-family="DejaVu Sans Mono, monospace" font-size="18" fill="#f4f1e8">
    <rect x="16" y="${H - 46}" width="${label.length * 11 + 24}" height="30" rx="4" fill="#000" fill-opacity="0.55"/>
    <text x="28" y="${H - 25}">${label}</text>
  </g>
</svg>`;

const scale = (x0: number, y: number, n: number, step: number) =>
  Array.from({ length: n + 1 }, (_, i) => {
    const x = x0 + i * step;
    const h = i % 10 === 0 ? 26 : i % 5 === 0 ? 18 : 11;
    const num =
      i % 10 === 0 ? `<text x="${x - 6}" y="${y + 46}" font-size="16" fill="#222">${i / 10}</text>` : '';
    return `<line x1="${x}" y1="${y}" x2="${x}" y2="${y + h}" stroke="#222" stroke-width="2"/>${num}`;
  }).join('');

const drawings: Record<string, (seed: number) => string> = {
  'tidebreaker-sub-arm-pin': (seed) =>
    frame(
      seed,
      '#3a342c',
      `
      <rect x="0" y="0" width="${W}" height="250" fill="url(#paint)" filter="url(#rough)"/>
      <rect x="60" y="250" width="840" height="22" fill="#1b2530"/>
      <rect x="90" y="300" width="780" height="180" rx="12" fill="url(#steel)"/>
      <rect x="380" y="300" width="150" height="180" fill="url(#polished)"/>
      ${Array.from({ length: 40 }, (_, i) => `<line x1="${384 + i * 3.6}" y1="${305 + ((i * 37) % 60)}" x2="${386 + i * 3.6}" y2="${400 + ((i * 53) % 70)}" stroke="#5c6166" stroke-width="0.8" stroke-opacity="0.7"/>`).join('')}
      <path d="M380 300 q-8 90 0 180 M530 300 q8 90 0 180" stroke="#2a2e32" stroke-width="4" fill="none"/>
      <ellipse cx="200" cy="470" rx="90" ry="22" fill="#20180c" fill-opacity="0.75"/>
      <ellipse cx="720" cy="320" rx="60" ry="10" fill="#3c2f18" fill-opacity="0.6"/>
      <rect x="640" y="300" width="10" height="180" fill="#e0b100" fill-opacity="0.85"/>
      <rect x="120" y="540" width="720" height="70" fill="#e8dcb0"/>
      ${scale(140, 540, 68, 10)}
      <path d="M380 520 v-30 M530 520 v-30" stroke="#ffd54a" stroke-width="3"/>
      <path d="M384 512 h142" stroke="#ffd54a" stroke-width="3" marker-end="none"/>
      <text x="392" y="505" font-family="DejaVu Sans, sans-serif" font-size="20" fill="#ffd54a">wear band</text>`,
      'Sub-arm pivot pin, drive side: polished wear band',
    ),
  'tidebreaker-bushing-bore': (seed) =>
    frame(
      seed,
      '#2c2a27',
      `
      <rect x="0" y="0" width="${W}" height="${H}" fill="url(#paint)" fill-opacity="0.6" filter="url(#rough)"/>
      <circle cx="480" cy="340" r="270" fill="url(#steel)"/>
      <circle cx="480" cy="340" r="205" fill="url(#bronze)"/>
      <circle cx="480" cy="340" r="170" fill="url(#bore)"/>
      ${Array.from({ length: 18 }, (_, i) => {
        const a = ((22 + i * 2.2) * Math.PI) / 180;
        const r1 = 172 + (i % 3) * 4;
        const r2 = 203 - (i % 4) * 3;
        return `<line x1="${480 + r1 * Math.cos(a)}" y1="${340 + r1 * Math.sin(a)}" x2="${480 + r2 * Math.cos(a + 0.02)}" y2="${340 + r2 * Math.sin(a + 0.02)}" stroke="#3d2c10" stroke-width="${1 + (i % 3)}"/>`;
      }).join('')}
      <path d="M600 470 q40 -20 60 -70" stroke="#e6d8a8" stroke-width="3" fill="none" stroke-opacity="0.6"/>
      ${[0, 60, 120, 180, 240, 300].map((d) => `<circle cx="${480 + 240 * Math.cos((d * Math.PI) / 180)}" cy="${340 + 240 * Math.sin((d * Math.PI) / 180)}" r="16" fill="#3a3f44" stroke="#1d2024" stroke-width="4"/>`).join('')}
      <circle cx="628" cy="456" r="70" fill="none" stroke="#ffd54a" stroke-width="4" stroke-dasharray="10 8"/>`,
      'Sub-arm bushing bore: scoring at 4 o’clock',
    ),
  'skylark-dial-indicator': (seed) =>
    frame(
      seed,
      '#41474d',
      `
      <rect x="0" y="420" width="${W}" height="300" fill="url(#steel)"/>
      <rect x="640" y="120" width="40" height="320" fill="#6c7278"/>
      <rect x="600" y="80" width="260" height="50" rx="8" fill="#23272b"/>
      <circle cx="380" cy="300" r="210" fill="#1e2226"/>
      <circle cx="380" cy="300" r="190" fill="#f3f1ea"/>
      ${Array.from({ length: 100 }, (_, i) => {
        const a = ((i * 3.6 - 90) * Math.PI) / 180;
        const r1 = i % 10 === 0 ? 150 : i % 5 === 0 ? 160 : 168;
        const num =
          i % 10 === 0
            ? `<text x="${380 + 128 * Math.cos(a) - 12}" y="${300 + 128 * Math.sin(a) + 7}" font-family="DejaVu Sans, sans-serif" font-size="20" fill="#222">${i}</text>`
            : '';
        return `<line x1="${380 + r1 * Math.cos(a)}" y1="${300 + r1 * Math.sin(a)}" x2="${380 + 182 * Math.cos(a)}" y2="${300 + 182 * Math.sin(a)}" stroke="#222" stroke-width="${i % 5 === 0 ? 3 : 1.5}"/>${num}`;
      }).join('')}
      <text x="340" y="250" font-family="DejaVu Sans, sans-serif" font-size="18" fill="#444">0.01 mm</text>
      <line x1="380" y1="300" x2="${380 + 170 * Math.cos(((55 * 3.6 - 90) * Math.PI) / 180)}" y2="${300 + 170 * Math.sin(((55 * 3.6 - 90) * Math.PI) / 180)}" stroke="#b3261e" stroke-width="5" stroke-linecap="round"/>
      <circle cx="380" cy="300" r="14" fill="#333"/>
      <rect x="372" y="510" width="16" height="90" fill="#9aa1a7"/>
      <circle cx="380" cy="606" r="10" fill="#d0d4d8"/>`,
      'Main pivot play, dial indicator, load reversed',
    ),
  'whirligig-restraint-latch': (seed) =>
    frame(
      seed,
      '#5a2f2a',
      `
      <rect x="0" y="0" width="${W}" height="${H}" fill="#7a3b31" filter="url(#rough)"/>
      <rect x="120" y="380" width="720" height="120" rx="10" fill="url(#steel)"/>
      ${Array.from({ length: 12 }, (_, i) => `<path d="M${170 + i * 55} 380 l40 -60 l15 60 z" fill="#8d959c" stroke="#3b4045" stroke-width="2"/>`).join('')}
      <g transform="rotate(-18 520 250)">
        <rect x="420" y="200" width="260" height="60" rx="12" fill="url(#polished)"/>
        <path d="M430 255 q-30 40 -10 70 q25 10 40 -20 z" fill="#aeb4b8" stroke="#3b4045" stroke-width="3"/>
        <circle cx="650" cy="230" r="20" fill="#3b4045"/>
      </g>
      <circle cx="435" cy="330" r="58" fill="none" stroke="#ffd54a" stroke-width="4" stroke-dasharray="10 8"/>
      <text x="505" y="350" font-family="DejaVu Sans, sans-serif" font-size="22" fill="#ffd54a">pawl tip rounded</text>`,
      'Seat 14 restraint latch: pawl slips off the first notch',
    ),
};

async function main() {
  const browser = await chromium.launch(launchOptions());
  try {
    const page = await browser.newPage({ viewport: { width: W, height: H } });
    const outDir = path.join(repoRoot, 'assets', 'demo');
    fs.mkdirSync(outDir, { recursive: true });
    let seed = 11;
    for (const file of demoPhotoFiles as readonly DemoPhotoFile[]) {
      const draw = drawings[file.name];
      if (!draw) throw new Error(`no drawing for ${file.name}`);
      await page.setContent(`<body style="margin:0">${draw(seed++)}</body>`);
      const jpeg = await page.screenshot({
        type: 'jpeg',
        quality: 60,
        clip: { x: 0, y: 0, width: W, height: H },
      });
      fs.writeFileSync(path.join(outDir, `${file.name}.jpg`), jpeg);
      console.log(`${file.name}.jpg ${Math.round(jpeg.length / 1024)} KB`);
    }
  } finally {
    await browser.close();
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
