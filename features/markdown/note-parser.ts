// The markdown-it instance for case notes: no raw HTML, strict links, GFM task lists.
// (markdown-it has GFM tables and strikethrough built in; task lists are added here.)
import MarkdownIt, { type StateCore, type Token } from 'markdown-it';
import { NOTE_MAX_NESTING } from '../../shared/markdown/nesting';
import { acceptableUrl } from './safety';

const TASK = /^\[([ xX])\][ \u00a0]/;

/** Marks `- [ ] text` / `- [x] text` list items (GFM spec §5.3) and strips the marker from their text. */
export function taskListRule(state: StateCore): void {
  const tokens = state.tokens;
  for (let i = 2; i < tokens.length; i++) {
    const inline = tokens[i];
    const paragraph = tokens[i - 1];
    const item = tokens[i - 2];
    if (inline?.type !== 'inline' || paragraph?.type !== 'paragraph_open' || item?.type !== 'list_item_open') continue;
    const match = TASK.exec(inline.content);
    const first = inline.children?.[0];
    if (!match || first?.type !== 'text' || !TASK.test(first.content)) continue;
    item.attrSet('data-task', match[1] === ' ' ? 'open' : 'done');
    first.content = first.content.replace(TASK, '');
    inline.content = inline.content.replace(TASK, '');
  }
}

export function createNoteParser() {
  // html: false is markdown-it's default; set it anyway so raw HTML stays text whatever the default becomes.
  // maxNesting backs up boundNoteNesting (shared/markdown/nesting.ts): a list level costs two levels.
  const md = MarkdownIt({ html: false, linkify: false, typographer: true, maxNesting: 2 * NOTE_MAX_NESTING + 10 });
  md.validateLink = acceptableUrl;
  md.core.ruler.push('task_lists', taskListRule);
  return md;
}

export type { Token };
