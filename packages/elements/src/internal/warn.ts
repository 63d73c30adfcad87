/**
 * One-time warnings for mis-configured elements. Elements never throw on bad data: they
 * show an empty or error state and call `warnOnce`, which reports each code once per element.
 *
 * @module
 */

/** Receives warnings; the default writes to `console.warn`. */
export type WarningHandler = (code: string, message: string, element: Element) => void;

let handler: WarningHandler = (code, message, element) => {
  // eslint-disable-next-line no-console
  console.warn(`<${element.localName}> [${code}] ${message}`);
};

const seen = new WeakMap<Element, Set<string>>();

/** Replaces the warning handler (tests capture warnings instead of logging); returns the previous one. */
export function setWarningHandler(next: WarningHandler): WarningHandler {
  const previous = handler;
  handler = next;
  return previous;
}

/** Reports `message` under `code` for `element`, at most once per element and code. */
export function warnOnce(element: Element, code: string, message: string): void {
  let codes = seen.get(element);
  if (!codes) seen.set(element, (codes = new Set()));
  if (codes.has(code)) return;
  codes.add(code);
  handler(code, message, element);
}
