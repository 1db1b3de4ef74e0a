/** The text of the input an `input` event came from (or the string itself). */
export function inputText(event: Event | string): string {
  if (typeof event === 'string') return event;
  const target = event.target;
  return target instanceof HTMLInputElement || target instanceof HTMLTextAreaElement
    ? target.value
    : '';
}
