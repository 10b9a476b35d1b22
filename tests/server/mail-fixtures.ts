import PDFDocument from 'pdfkit';

/**
 * A small real PDF written by pdfkit (a reference PDF library, not our renderer), standing in for a notice.
 * Compression off and a fixed creation date keep the bytes the same run to run.
 */
export function makeSamplePdf(title = 'Notice PW-2026-0007'): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4', compress: false, info: { CreationDate: new Date(0) } });
    const chunks: Buffer[] = [];
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.fontSize(14).text(title);
    doc.fontSize(10).text('Sweep arm pivot pin: clearance 1.9 mm against a 1.5 mm wear limit.');
    doc.end();
  });
}

/** Invented demo-style recipients (the .test domain is reserved and reaches no one). */
export const operatorAddress = 'safety@tamsworth-pier.test';
export const secondOperatorAddress = 'duty-manager@tamsworth-pier.test';
