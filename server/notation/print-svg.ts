/**
 * The engraving as a printer needs it. The print compiler (server/pdf/print-drawing.ts) walks
 * every element and knows only attributes that paint; a 16-bar drill has some 2,000
 * groups that only carry the app's hooks (class, id, data-*), so those hooks are dropped and the
 * groups left without an attribute are unwrapped. What is drawn, and how, is unchanged: only
 * attributes no renderer paints with go, and a group with none passes nothing to its children.
 */
import { SvgNode } from './svg-document';

/** Attributes for scripts, styling hooks and assistive technology, never painted. */
function isHook(name: string): boolean {
  return (
    name === 'class' ||
    name === 'id' ||
    name === 'role' ||
    name === 'pointer-events' ||
    name === 'shadowColor' ||
    name.startsWith('data-') ||
    name.startsWith('aria-')
  );
}

/** Strip hooks from `root`'s tree and unwrap the groups left bare (in place). */
export function simplifyForPrint(root: SvgNode): void {
  for (const name of root.attributeNames()) if (isHook(name)) root.removeAttribute(name);
  const children: (typeof root.childNodes)[number][] = [];
  for (const child of root.childNodes) {
    if (!(child instanceof SvgNode)) {
      children.push(child);
      continue;
    }
    simplifyForPrint(child);
    if (child.nodeName === 'g' && child.attributeNames().length === 0)
      children.push(...child.childNodes);
    else if (!(child.nodeName === 'g' && child.childNodes.length === 0)) children.push(child);
  }
  root.replaceChildren(...children);
}
