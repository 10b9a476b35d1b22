/**
 * Renders sample notices to PDF under artifacts/pdf/ and, when poppler's `pdftoppm` is installed, each
 * page to PNG beside them, for people to look at: `npx tsx scripts/pdf-preview.ts`.
 * Samples: the test fixture on A4 and Letter, a long notice (25 findings, a 2000-character description,
 * 42 result rows, one photo missing), one with every optional field empty and every long one longer,
 * and a ride status notice without an inspection.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';

import type { NoticeDocument } from '@/features/notices/schema';
import { renderNoticePdf } from '@/server/notices/pdf';
import { repoRoot } from '@/server/paths';
import { fixtureNotice, fixturePhotos, loadFixturePhoto, noticeWithFindings } from '@/scripts/sample-notice';

const outDir = path.join(repoRoot, 'artifacts', 'pdf');

/** 25 findings, two with descriptions of the longest allowed length, and a results table of 42 rows. */
function longNotice() {
  const doc = noticeWithFindings(25);
  const words = 'The bushing shows fretting debris at both faces and the grease nipple is blocked; ';
  const long = words.repeat(24).slice(0, 2000).trim();
  for (const i of [1, 5]) doc.findings[i] = { ...doc.findings[i], description: long };
  doc.results = Array.from({ length: 7 }, (_, i) =>
    fixtureNotice.results.map((r) => ({ ...r, label: `${r.label} (run ${i + 1})` })),
  ).flat();
  return doc;
}

/** Everything optional left out and everything long made longer, to see that nothing overlaps. */
function edgeNotice(): NoticeDocument {
  const f = fixtureNotice.findings;
  return {
    ...fixtureNotice,
    reference: 'PW-2026-0045',
    issuer: {
      name: 'Halvard Ride Inspection Services — Northern Region Travelling Rides and Amusement Devices Office',
      address:
        'Unit 4, Coldharbour Yard, Wexley Road Industrial Estate, Upper Tamsworth, Tamsworth and District TW3 8QP',
      phone: null,
    },
    operator: { ...fixtureNotice.operator, address: null },
    ride: {
      ...fixtureNotice.ride,
      name: 'Tidecaller Grand Pendulum (the long-arm version with the rotating gondola ring)',
      maker: null,
      model: null,
      serial: null,
      year: null,
    },
    site: null,
    inspection: fixtureNotice.inspection && {
      ...fixtureNotice.inspection,
      inspectorCredential: null,
      designVersion: null,
      engineVersion: null,
    },
    checklist: null,
    findings: [
      { ...f[2], severity: 'note', ruleRef: null, requiredAction: null, dueOn: null, photos: [] },
      { ...f[1], state: 'closed', photos: Array.from({ length: 7 }, () => f[1].photos[0]) },
    ],
    operatingStatus: { status: 'in_service', reason: null },
    reinspection: { required: false, reason: null },
    note: null,
    url: `https://pivotwatch.example/notices/${'0123456789abcdef'.repeat(8)}`,
  };
}

const samples = [
  { name: 'notice-a4', doc: fixtureNotice, pageSize: 'A4' as const, loadPhoto: loadFixturePhoto },
  { name: 'notice-letter', doc: fixtureNotice, pageSize: 'LETTER' as const, loadPhoto: loadFixturePhoto },
  {
    name: 'notice-long-a4',
    doc: longNotice(),
    pageSize: 'A4' as const,
    // One photo missing, to show its placeholder.
    loadPhoto: (sha: string) => (sha === fixturePhotos.pinBoss.sha256 ? null : loadFixturePhoto(sha)),
  },
  { name: 'edge-a4', doc: edgeNotice(), pageSize: 'A4' as const, loadPhoto: loadFixturePhoto },
  {
    name: 'status-letter',
    doc: {
      ...fixtureNotice,
      kind: 'status_change' as const,
      reference: 'PW-2026-0044',
      inspection: null,
      results: [],
      loadSummary: [],
      checklist: null,
      findings: fixtureNotice.findings.slice(1),
      operatingStatus: {
        status: 'restricted' as const,
        reason: 'Gondola runs with the outer seats empty until finding 2 is closed.',
      },
      note: null,
    },
    pageSize: 'LETTER' as const,
    loadPhoto: loadFixturePhoto,
  },
];

async function main() {
  mkdirSync(outDir, { recursive: true });
  for (const f of readdirSync(outDir)) rmSync(path.join(outDir, f));
  const hasPoppler = spawnSync('pdftoppm', ['-v']).error === undefined;
  for (const s of samples) {
    const pdf = await renderNoticePdf(s.doc, { pageSize: s.pageSize, loadPhoto: s.loadPhoto });
    const file = path.join(outDir, `${s.name}.pdf`);
    writeFileSync(file, pdf);
    console.log(`${path.relative(repoRoot, file)}  ${(pdf.length / 1024).toFixed(0)} KB`);
    if (hasPoppler) {
      const r = spawnSync('pdftoppm', ['-png', '-r', '110', file, path.join(outDir, s.name)]);
      if (r.status !== 0) console.error(`pdftoppm failed for ${s.name}: ${r.stderr.toString()}`);
    }
  }
  if (!hasPoppler) console.log('pdftoppm not found: install poppler-utils to get PNG pages as well.');
  else console.log(`PNG pages in ${path.relative(repoRoot, outDir)}/`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
