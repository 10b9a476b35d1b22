/**
 * A QR code as a picture, for tests that read codes back: the `qrcode` npm package's module matrix
 * (QRCode.create), each module `scale` pixels square, with ISO/IEC 18004's four-module quiet zone, placed
 * on a white frame. As RGBA (what jsQR reads) or as a Y4M video (what Chromium's fake camera plays).
 */
import QRCode from 'qrcode';

export type Grey = { width: number; height: number; dark: (x: number, y: number) => boolean };

/** The code of `text`, centred on a white frame of `width` × `height` pixels (or just big enough). */
export function qrPicture(text: string, opts: { scale: number; width?: number; height?: number }): Grey {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'M' });
  const side = (modules.size + 8) * opts.scale;
  const width = opts.width ?? side;
  const height = opts.height ?? side;
  const left = Math.floor((width - side) / 2) + 4 * opts.scale;
  const top = Math.floor((height - side) / 2) + 4 * opts.scale;
  return {
    width,
    height,
    dark: (x, y) => {
      const col = Math.floor((x - left) / opts.scale);
      const row = Math.floor((y - top) / opts.scale);
      return col >= 0 && row >= 0 && col < modules.size && row < modules.size && modules.get(row, col) === 1;
    },
  };
}

export function toRgba(p: Grey): Uint8ClampedArray {
  const out = new Uint8ClampedArray(p.width * p.height * 4);
  for (let y = 0; y < p.height; y++)
    for (let x = 0; x < p.width; x++) {
      const v = p.dark(x, y) ? 0 : 255;
      out.set([v, v, v, 255], (y * p.width + x) * 4);
    }
  return out;
}

/**
 * A still video of the picture in the YUV4MPEG2 format Chromium's `--use-file-for-fake-video-capture`
 * plays (4:2:0 planes: Y at full size, U and V at half): dark modules Y=16, light Y=235, as video range
 * black and white; U=V=128, no colour. Width and height must be even.
 */
export function toY4m(p: Grey, frames = 10): Buffer {
  const ySize = p.width * p.height;
  const cSize = (p.width / 2) * (p.height / 2);
  const frame = Buffer.alloc(ySize + 2 * cSize, 128);
  for (let y = 0; y < p.height; y++)
    for (let x = 0; x < p.width; x++) frame[y * p.width + x] = p.dark(x, y) ? 16 : 235;
  const parts: Buffer[] = [Buffer.from(`YUV4MPEG2 W${p.width} H${p.height} F10:1 Ip A1:1 C420jpeg\n`)];
  for (let i = 0; i < frames; i++) parts.push(Buffer.from('FRAME\n'), frame);
  return Buffer.concat(parts);
}
