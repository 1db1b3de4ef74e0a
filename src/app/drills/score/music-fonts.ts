import academicoBold from '@vexflow-fonts/academico/academico-bold.woff2';
import academico from '@vexflow-fonts/academico/academico.woff2';
import bravura from '@vexflow-fonts/bravura/bravura.woff2';

/**
 * The score's two faces, VexFlow's defaults: Bravura for music symbols and Academico for text on
 * the staff. They are the same files the `vexflow/bravura` entry embeds as data URLs, served
 * here as files of their own so the engraver's code stays small and the fonts download beside it.
 */
const FACES: readonly { family: string; url: string; descriptors: FontFaceDescriptors }[] = [
  { family: 'Bravura', url: bravura, descriptors: { display: 'block' } },
  { family: 'Academico', url: academico, descriptors: { display: 'swap' } },
  { family: 'Academico', url: academicoBold, descriptors: { display: 'swap', weight: 'bold' } },
];

let loading: Promise<void> | null = null;

/**
 * Load (once) the faces VexFlow measures its glyphs with; resolves when all are ready. A failed
 * load rejects (the score says it could not be drawn) and the next call tries again.
 */
export function loadMusicFonts(): Promise<void> {
  loading ??= (async () => {
    await Promise.all(
      FACES.map(({ family, url, descriptors }) => {
        const face = new FontFace(family, `url(${url})`, descriptors);
        document.fonts.add(face);
        return face.load();
      }),
    );
  })().catch((error: unknown) => {
    loading = null;
    throw error;
  });
  return loading;
}
