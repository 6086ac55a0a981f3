// QR codes from camera frames, by the Barcode Detection API's polyfill (ZXing-C++ as WebAssembly).
// Its default fetches the .wasm from a public CDN at run time; a hall's network may have no way
// out, so the file is taken from our own build (Vite copies it into assets/ and the service worker
// keeps it) and nothing is fetched from elsewhere.
import { BarcodeDetector, prepareZXingModule } from 'barcode-detector/ponyfill';
import wasmUrl from 'zxing-wasm/reader/zxing_reader.wasm?url';

prepareZXingModule({
  overrides: { locateFile: (path: string, prefix: string) => (path.endsWith('.wasm') ? wasmUrl : prefix + path) },
  fireImmediately: false,
});

let detector: BarcodeDetector | null = null;

/** The text of the first QR code found in the picture, or null. */
export async function readQrCode(source: ImageBitmapSource): Promise<string | null> {
  detector ??= new BarcodeDetector({ formats: ['qr_code'] });
  const found = await detector.detect(source);
  return found[0]?.rawValue ?? null;
}
