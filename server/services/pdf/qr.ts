/**
 * A QR code drawn as vector squares (npm qrcode's module matrix), so it stays sharp at any print
 * size. Error correction M (about 15 % of the code may be damaged and still read), with the
 * four-module quiet zone ISO/IEC 18004 asks for.
 */
import QRCode from 'qrcode';

const QUIET_MODULES = 4;

/** Draw `text` as a QR code `size` points square (quiet zone included) with its top-left at (x, y). */
export function drawQr(doc: PDFKit.PDFDocument, text: string, x: number, y: number, size: number): void {
  const qr = QRCode.create(text, { errorCorrectionLevel: 'M' });
  const count = qr.modules.size;
  const unit = size / (count + 2 * QUIET_MODULES);
  doc.save();
  doc.rect(x, y, size, size).fill('#FFFFFF');
  doc.fillColor('#000000');
  for (let row = 0; row < count; row += 1) {
    for (let col = 0; col < count; col += 1) {
      if (!qr.modules.get(row, col)) continue;
      // a hair of overlap so neighbouring squares leave no seams when rasterised
      doc.rect(x + (col + QUIET_MODULES) * unit, y + (row + QUIET_MODULES) * unit, unit + 0.05, unit + 0.05);
    }
  }
  doc.fill('#000000');
  doc.restore();
}
