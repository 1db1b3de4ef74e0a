import QRCode from 'qrcode';

/**
 * The link as a QR code in SVG (vector, so it prints sharp), with a quiet zone of two modules;
 * error correction M survives a smudged or folded sheet (common practice for print).
 */
export function qrSvg(link: string): Promise<string> {
  return QRCode.toString(link, { type: 'svg', margin: 2, errorCorrectionLevel: 'M' });
}
