// A QR code as a small one-bit greyscale PNG with no alpha channel, made directly from the code's modules.
// pdfkit embeds such a PNG's compressed data as it is (no decoding, no alpha mask to split off),
// which is what makes a sheet of hundreds of labels quick; qrcode's own PNG writer goes through
// RGBA and took about 30 ms a code. PNG layout: RFC 2083 / ISO/IEC 15948.
import QRCode from 'qrcode';
import { crc32, deflateSync } from 'node:zlib';

function chunk(type: string, data: Buffer) {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, 'latin1');
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])) >>> 0, 0);
  return Buffer.concat([head, data, crc]);
}

/** `scale` pixels per module, `quiet` modules of white round the code (ISO/IEC 18004 asks for 4). */
export function qrPng(text: string, opts: { scale: number; quiet: number }): Buffer {
  const qr = QRCode.create(text, { errorCorrectionLevel: 'M' });
  const n = qr.modules.size;
  const side = (n + 2 * opts.quiet) * opts.scale;
  // One bit a pixel (1 = white), rows padded to whole bytes, each row led by its filter byte (none).
  const rowBytes = Math.ceil(side / 8) + 1;
  const raw = Buffer.alloc(rowBytes * side, 255);
  for (let y = 0; y < side; y++) raw[y * rowBytes] = 0;
  for (let r = 0; r < n; r++) {
    // One pixel row for this module row, then copied to the `scale` rows it covers.
    const first = (r + opts.quiet) * opts.scale * rowBytes;
    for (let c = 0; c < n; c++) {
      if (!qr.modules.get(r, c)) continue;
      for (let x = (c + opts.quiet) * opts.scale, end = x + opts.scale; x < end; x++) raw[first + 1 + (x >> 3)]! &= ~(0x80 >> (x & 7));
    }
    for (let k = 1; k < opts.scale; k++) raw.copy(raw, first + k * rowBytes, first, first + rowBytes);
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(side, 0);
  ihdr.writeUInt32BE(side, 4);
  ihdr[8] = 1; // bit depth
  ihdr[9] = 0; // greyscale
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw)),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}
