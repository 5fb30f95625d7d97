/** Text of a PDF, extracted by pdf-parse (Mozilla's pdf.js inside), for checking what a download says. */
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);
// The library file itself: the package's index runs a self-test when loaded without a parent module.
const pdfParse = require('pdf-parse/lib/pdf-parse.js') as (data: Buffer) => Promise<{ text: string; numpages: number }>;

export async function pdfText(data: Buffer | ArrayBuffer): Promise<string> {
  const r = await pdfParse(Buffer.isBuffer(data) ? data : Buffer.from(data));
  return r.text;
}
