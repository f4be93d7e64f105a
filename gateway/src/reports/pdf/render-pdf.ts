import { dirname, join } from 'node:path';
import type { TDocumentDefinitions } from 'pdfmake/interfaces';
import pdfmake = require('pdfmake');

const FONT_DIR = join(dirname(require.resolve('pdfmake/fonts/Roboto.js')), 'Roboto');

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
