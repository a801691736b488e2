// Every bound a case note goes through before a Markdown parser sees it, and the one notice that
// says what was cut. The server's extraction and the client's renderer both call boundNote.
import { boundLinkOpeners, linkOpenersSentence } from './link-openers';
import { boundNoteNesting, nestingSentence, STORED_AS_WRITTEN } from './nesting';

export interface BoundNote {
  /** The text to parse: the note itself when nothing was cut. */
  text: string;
  /** What was cut, for the reader, or null. */
  notice: string | null;
}

export function boundNote(body: string): BoundNote {
  const nesting = boundNoteNesting(body);
  const links = boundLinkOpeners(nesting.text);
  const sentences = [nestingSentence(nesting), linkOpenersSentence(links)].filter(Boolean);
  return { text: links.text, notice: sentences.length ? [...sentences, STORED_AS_WRITTEN].join(' ') : null };
}
