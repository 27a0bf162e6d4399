// The JSON text of a design file read strictly: a byte-order mark dropped; zero bytes (UTF-16 read as UTF-8),
// comments and keys given twice refused; a syntax error placed by line and column.

/** Says what is wrong and where: `path` a field ('components.L.tolerance'), '' for the whole text. Never returns. */
export type JsonFault = (path: string, problem: string) => never;

/** A UTF-8 byte-order mark, as some Windows editors save JSON: not part of the JSON text. */
const BYTE_ORDER_MARK = /^\uFEFF/;

/** The value of `text`, every fault passed to `fail`. */
export function parseJsonStrictly(text: string, fail: JsonFault): unknown {
  const json = text.replace(BYTE_ORDER_MARK, '');
  if (json.includes('\u0000')) fail('', 'the file holds zero bytes: it is probably saved as UTF-16; save it as UTF-8');
  let value: unknown;
  try {
    value = JSON.parse(json);
  } catch (e) {
    const comment = scan(json).comment;
    if (comment !== null) fail('', `${placeOf(json, comment)}: JSON has no comments; move the note into "notes"`);
    const message = (e as Error).message;
    const position = /at position (\d+)/.exec(message);
    // The parser's own place ('in JSON at position 70 (line 1 column 71)') is said once, as line and column.
    const reason = position ? message.replace(/\s*in JSON at position \d+.*$/, '') : message;
    fail('', `not valid JSON${position ? ` at ${placeOf(json, Number(position[1]))}` : ''} (${reason})`);
  }
  const twice = scan(json).duplicate;
  if (twice) fail(twice.path, `given twice (line ${lineOf(json, twice.at)}); JSON keeps only the last, so one of them would be silently lost`);
  return value;
}

/** 'line 3, column 7' of a character offset, both counted from 1. */
function placeOf(text: string, offset: number): string {
  const before = text.slice(0, offset);
  return `line ${lineOf(text, offset)}, column ${offset - before.lastIndexOf('\n')}`;
}

function lineOf(text: string, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}

/** One open object or array while scanning: its field path, and for an object its keys so far. */
interface Frame {
  path: string;
  keys: Set<string> | null;
  index: number;
  /** An object awaits a key (after '{' or ','); the key just read, whose value comes next. */
  expectKey: boolean;
  key: string | null;
}

/**
 * One pass over the text outside its strings: the offset of the first comment ('/' where JSON has none), and the
 * first key an object gives twice with its path and offset (meaningful for text JSON.parse accepts).
 */
function scan(text: string): { comment: number | null; duplicate: { path: string; at: number } | null } {
  const stack: Frame[] = [];
  const childPath = () => {
    const top = stack[stack.length - 1];
    if (!top) return '';
    const name = top.keys ? (top.key ?? '') : `[${top.index}]`;
    return top.keys && top.path !== '' ? `${top.path}.${name}` : `${top.path}${name}`;
  };
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    const top = stack[stack.length - 1];
    if (c === '"') {
      const end = stringEnd(text, i);
      if (top?.keys && top.expectKey) {
        // The key as written: two spellings of one key ('a' and '\\u0061') are not told apart.
        const key = text.slice(i + 1, end);
        top.key = key;
        top.expectKey = false;
        if (top.keys.has(key)) return { comment: null, duplicate: { path: childPath(), at: i } };
        top.keys.add(key);
      }
      i = end;
    } else if (c === '/') {
      return { comment: i, duplicate: null };
    } else if (c === '{' || c === '[') {
      stack.push({ path: childPath(), keys: c === '{' ? new Set() : null, index: 0, expectKey: c === '{', key: null });
    } else if (c === '}' || c === ']') {
      stack.pop();
    } else if (c === ',' && top) {
      if (top.keys) top.expectKey = true;
      else top.index++;
    }
  }
  return { comment: null, duplicate: null };
}

/** The offset of the quote that closes the string opening at `start` (the text's end when it never closes). */
function stringEnd(text: string, start: number): number {
  for (let i = start + 1; i < text.length; i++) {
    if (text[i] === '\\') i++;
    else if (text[i] === '"') return i;
  }
  return text.length - 1;
}
