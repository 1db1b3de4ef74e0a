/** One paragraph of a message, or a button-like link. */
export type MailBlock =
  { readonly text: string } | { readonly link: string; readonly label: string };

/** What a feature writes; {@link renderMail} turns it into the text and HTML parts. */
export interface MailContent {
  readonly subject: string;
  readonly greeting: string;
  readonly blocks: readonly MailBlock[];
}

/** The two parts of a message as sent. */
export interface RenderedMail {
  readonly subject: string;
  readonly text: string;
  readonly html: string;
}

const FOOTER = 'Tensile · drills, assignments and practice for drum-set students';

/**
 * Tensile's branded message: a plain-text part that reads well on its own, and a small HTML part
 * with inline styles only and no images (remote images track readers and are often blocked).
 */
export function renderMail(content: MailContent): RenderedMail {
  const textBlocks = content.blocks.map((block) =>
    'link' in block ? `${block.label}:\n${block.link}` : block.text,
  );
  const text = [content.greeting, ...textBlocks, `-- \n${FOOTER}`].join('\n\n') + '\n';

  const htmlBlocks = content.blocks.map((block) =>
    'link' in block
      ? `<p><a href="${escapeHtml(block.link)}" style="display:inline-block;padding:10px 16px;` +
        `background:#3b3f8f;color:#ffffff;border-radius:6px;text-decoration:none">` +
        `${escapeHtml(block.label)}</a></p>` +
        `<p style="font-size:13px;color:#555555">${escapeHtml(block.link)}</p>`
      : `<p>${escapeHtml(block.text)}</p>`,
  );
  const html =
    '<!doctype html><html><body style="margin:0;padding:24px;font-family:Arial,sans-serif;' +
    'color:#1d1d24;background:#f6f6fb">' +
    '<div style="max-width:560px;margin:0 auto;background:#ffffff;padding:24px;border-radius:8px">' +
    '<p style="font-size:20px;font-weight:bold;color:#3b3f8f;margin:0 0 16px">Tensile</p>' +
    `<p>${escapeHtml(content.greeting)}</p>${htmlBlocks.join('')}` +
    `<p style="font-size:12px;color:#777777;margin-top:24px">${escapeHtml(FOOTER)}</p>` +
    '</div></body></html>';
  return { subject: content.subject, text, html };
}

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}
