// Bounds how deeply a case note nests lists and block quotes before any Markdown parser sees it.
// A note of "- " repeated 4,000 times is 8 KB, but parsers spend time (and stack) per open
// container on every line, so deep nesting turns a small note into seconds of blocked server or
// browser. No real note nests 20 deep, so markers past that depth are dropped (the text after them
// is kept) and the note says what was cut. Pure and linear in the note's length: the server's
// extraction and the client's renderer both read the bounded text.

/** Deepest list / block-quote nesting a note keeps (common practice, no source: real notes stay under 5). */
export const NOTE_MAX_NESTING = 20;

export interface BoundedNote {
  /** The note with every line nested at most `maxDepth` deep; the same string when nothing was cut. */
  text: string;
  /** How many lines lost markers or indentation. */
  cutLines: number;
  /** The deepest nesting found on any line, before cutting. */
  deepest: number;
}

const TAB_WIDTH = 4; // CommonMark §2.2: tabs stop every 4 columns
const FENCE = /^(`{3,}|~{3,})/;

interface LinePrefix {
  /** Columns of white space before the first marker. */
  indent: number;
  /** Where the leading white space ends. */
  indentEnd: number;
  /** End offset of each container marker (after the white space that follows it). */
  markerEnds: number[];
}

const isSpace = (c: string | undefined) => c === ' ' || c === '\t';
const isDigit = (c: string | undefined) => c !== undefined && c >= '0' && c <= '9';

/** Length of a list or quote marker at `i` (with the white space after it), or 0 when there is none. */
function markerAt(line: string, i: number): number {
  const c = line[i];
  if (c === '>') return 1 + (isSpace(line[i + 1]) ? 1 : 0);
  if ((c === '-' || c === '*' || c === '+') && (isSpace(line[i + 1]) || i + 1 === line.length)) return line[i + 1] ? 2 : 1;
  let j = i;
  while (isDigit(line[j]) && j - i < 9) j++; // CommonMark §5.2: at most 9 digits
  if (j > i && (line[j] === '.' || line[j] === ')') && (isSpace(line[j + 1]) || j + 1 === line.length)) return j - i + 1 + (line[j + 1] ? 1 : 0);
  return 0;
}

function readPrefix(line: string): LinePrefix {
  let i = 0;
  let indent = 0;
  while (isSpace(line[i])) indent += line[i++] === '\t' ? TAB_WIDTH : 1;
  const indentEnd = i;
  const markerEnds: number[] = [];
  for (;;) {
    while (isSpace(line[i])) i++;
    const length = markerAt(line, i);
    if (!length) break;
    i += length;
    markerEnds.push(i);
  }
  return { indent, indentEnd, markerEnds };
}

/** Nesting of a line: its markers plus what its indentation can open (a list item's content starts 2 columns in). */
const depthOf = (p: LinePrefix) => p.markerEnds.length + Math.floor(p.indent / 2);

/** The line cut back to `maxDepth`: indentation first, then the markers past the limit; the text stays. */
function cutLine(line: string, p: LinePrefix, maxDepth: number): string {
  const keptMarkers = Math.min(p.markerEnds.length, maxDepth);
  const indent = ' '.repeat(Math.min(p.indent, 2 * (maxDepth - keptMarkers)));
  const markersStart = p.indentEnd;
  const keptEnd = keptMarkers ? p.markerEnds[keptMarkers - 1]! : markersStart;
  const rest = line.slice(p.markerEnds.length ? p.markerEnds[p.markerEnds.length - 1]! : markersStart).replace(/^[ \t]+/, '');
  const kept = line.slice(markersStart, keptEnd);
  return indent + kept + (kept && rest && !isSpace(kept[kept.length - 1]) ? ' ' : '') + rest;
}

/** Fence tracking, so lines inside a fenced code block are never touched (CommonMark §4.5, simplified). */
function fenceOf(line: string, p: LinePrefix = readPrefix(line)): string | null {
  if (!p.markerEnds.length && p.indent >= 4) return null; // indented code, not a fence
  const start = p.markerEnds.length ? p.markerEnds[p.markerEnds.length - 1]! : p.indentEnd;
  return FENCE.exec(line.slice(start).trimStart())?.[1] ?? null;
}

const closesFence = (open: string, fence: string | null) => !!fence && fence[0] === open[0] && fence.length >= open.length;

/** Calls `visit` for every line outside fenced code blocks; `visit` may return a replacement line. */
export function eachLineOutsideFences(body: string, visit: (line: string, index: number) => string | void): string {
  const lines = body.split('\n');
  let openFence: string | null = null;
  let changed = false;
  for (let n = 0; n < lines.length; n++) {
    const fence = fenceOf(lines[n]!);
    if (openFence) {
      if (closesFence(openFence, fence)) openFence = null;
      continue;
    }
    if (fence) openFence = fence;
    const replaced = visit(lines[n]!, n);
    if (replaced !== undefined && replaced !== lines[n]) {
      lines[n] = replaced;
      changed = true;
    }
  }
  return changed ? lines.join('\n') : body;
}

export function boundNoteNesting(body: string, maxDepth = NOTE_MAX_NESTING): BoundedNote {
  let cutLines = 0;
  let deepest = 0;
  const text = eachLineOutsideFences(body, (line) => {
    const prefix = readPrefix(line);
    const depth = depthOf(prefix);
    deepest = Math.max(deepest, depth);
    if (depth <= maxDepth) return;
    cutLines++;
    return cutLine(line, prefix, maxDepth);
  });
  return { text, cutLines, deepest };
}

export const STORED_AS_WRITTEN = 'The note is stored as written.';

/** What was cut, in one sentence, or null when nothing was. */
export function nestingSentence(bound: BoundedNote, maxDepth = NOTE_MAX_NESTING): string | null {
  if (!bound.cutLines) return null;
  const lines = bound.cutLines === 1 ? '1 line is' : `${bound.cutLines.toLocaleString('en-GB')} lines are`;
  return `This note nests lists or quotes ${bound.deepest.toLocaleString('en-GB')} deep; ${lines} shown flattened to ${maxDepth} levels.`;
}

/** What to tell the reader when a note was cut, or null when it is shown as written. */
export function nestingNotice(bound: BoundedNote, maxDepth = NOTE_MAX_NESTING): string | null {
  const sentence = nestingSentence(bound, maxDepth);
  return sentence && `${sentence} ${STORED_AS_WRITTEN}`;
}
