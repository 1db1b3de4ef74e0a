// The few pdfmake 0.3 server entry points Tensile uses (the package ships no types).
declare module 'pdfmake' {
  import type { Readable } from 'node:stream';

  interface FontFaces {
    normal: string;
    bold?: string;
    italics?: string;
    bolditalics?: string;
  }

  interface OutputDocument {
    /** The pdfkit document: a readable stream that ends after `end()`. */
    getStream(): Promise<Readable & { end(): void }>;
    getBuffer(): Promise<Buffer>;
  }

  interface PdfMake {
    addFonts(fonts: Record<string, FontFaces>): void;
    setUrlAccessPolicy(policy: (url: string) => boolean): void;
    setLocalAccessPolicy(policy: (path: string) => boolean): void;
    createPdf(definition: object, options?: object): OutputDocument;
  }

  const pdfmake: PdfMake;
  export default pdfmake;
}
