import academicoBold from '@vexflow-fonts/academico/academico-bold.woff2';
import academico from '@vexflow-fonts/academico/academico.woff2';
import bravura from '../../../../fonts/tensile-music.woff2';

/**
 * The score's two faces, VexFlow's defaults: Bravura for music symbols and Academico for text on
 * the staff, served as files of their own so the engraver's code stays small and the fonts
 * download beside it. The music face is a subset of Bravura (fonts/README.md): the SMuFL ranges
 * drum notation draws, 73 kB instead of 247 kB; VexFlow still asks for it as "Bravura".
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
