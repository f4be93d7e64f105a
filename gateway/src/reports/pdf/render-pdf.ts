import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import type * as PdfMake from 'pdfmake';
import type { TDocumentDefinitions } from 'pdfmake/interfaces';

// pdfmake's node entry is an instance whose methods sit on its prototype; the ES import helper
// copies only own properties, so the module is loaded as it is.
const load = createRequire(__filename);
const pdfmake = load('pdfmake') as typeof PdfMake;
const FONT_DIR = join(dirname(load.resolve('pdfmake/fonts/Roboto.js')), 'Roboto');

let ready = false;
/** Roboto from pdfmake's own files; no URL and no other file may be read by a document. */
function setUp(): void {
  if (ready) return;
  pdfmake.setFonts({
    Roboto: {
      normal: join(FONT_DIR, 'Roboto-Regular.ttf'),
      bold: join(FONT_DIR, 'Roboto-Medium.ttf'),
      italics: join(FONT_DIR, 'Roboto-Italic.ttf'),
      bolditalics: join(FONT_DIR, 'Roboto-MediumItalic.ttf'),
    },
  });
  pdfmake.setUrlAccessPolicy(() => false);
  pdfmake.setLocalAccessPolicy((path) => path.startsWith(FONT_DIR));
  ready = true;
}

export async function renderPdf(doc: TDocumentDefinitions): Promise<Buffer> {
  setUp();
  return pdfmake.createPdf(doc).getBuffer();
}
