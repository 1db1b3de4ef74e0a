import { Observable, from } from 'rxjs';

/** Largest import the server takes; a bigger file is refused before it is sent. */
export const MAX_IMPORT_BYTES = 64 * 1024;

/** Save `value` as a pretty-printed `.json` file named after `title`. */
export function downloadJson(value: unknown, title: string): void {
  const blob = new Blob([JSON.stringify(value, null, 2) + '\n'], { type: 'application/json' });
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = `${fileName(title)}.tensile.json`;
  link.click();
  URL.revokeObjectURL(url);
}

/** A file name from a title: letters, digits and dashes. */
export function fileName(title: string): string {
  return (
    title
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'rule-card'
  );
}

/** Read a chosen file as JSON; a file that is too big or not JSON fails with a sentence. */
export function readJsonFile(file: File): Observable<unknown> {
  return from(
    (async () => {
      if (file.size > MAX_IMPORT_BYTES) {
        throw new Error(`"${file.name}" is larger than 64 KB: a rule card file is much smaller.`);
      }
      const text = await file.text();
      try {
        return JSON.parse(text) as unknown;
      } catch {
        throw new Error(`"${file.name}" is not a JSON file, so it cannot be imported.`);
      }
    })(),
  );
}
