/**
 * Control characters (C0, DEL, C1), line and paragraph separators and the bidirectional overrides: text
 * from input files (satellite ids, clock names, review ids) carrying them could move the cursor, recolour
 * or rewrite a terminal, or reorder what is shown (common practice, no source).
 */
const UNSAFE_CHARACTERS = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

/**
 * Escapes the characters of {@link UNSAFE_CHARACTERS} as visible text (`\x1B`, `\u202E`), so a value
 * from a file is shown as it is and cannot act on the terminal.
 * @param keep  Characters left as they are (e.g. `\n` for a whole multi-line output).
 */
export function escapeControlCharacters(text: string, keep = ''): string {
  return text.replace(UNSAFE_CHARACTERS, (c) => {
    if (keep.includes(c)) return c;
    const n = c.charCodeAt(0);
    return n < 0x100 ? `\\x${n.toString(16).toUpperCase().padStart(2, '0')}` : `\\u${n.toString(16).toUpperCase()}`;
  });
}
