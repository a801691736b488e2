// Reads a case note with remark + GFM: the trouble codes it mentions, readings with units
// and its headings. The note itself is stored as written; rendering is the client's job.
import { remark } from 'remark';
import remarkGfm from 'remark-gfm';
import type { Root, RootContent } from 'mdast';
import { findDtcsInText } from '../../shared/codes';
import type { NoteExtract } from '../../shared/schemas/cases';
import { findMeasurements } from '../../shared/units';

const parser = remark().use(remarkGfm);

type Node = Root | RootContent;

function textOf(node: Node): string {
  if ('value' in node && typeof node.value === 'string' && node.type !== 'html') return node.value;
  if ('children' in node) return node.children.map(textOf).join(node.type === 'paragraph' || node.type === 'heading' ? '' : ' ');
  return '';
}

/** Text runs of the note, one per block, so a reading never spans two table cells. */
function blocks(node: Node, out: string[]) {
  if (node.type === 'paragraph' || node.type === 'heading' || node.type === 'tableCell' || node.type === 'code' || node.type === 'inlineCode') {
    out.push(textOf(node));
    return;
  }
  if ('children' in node) for (const child of node.children) blocks(child, out);
}

export function extractFromNote(body: string, caseCodes: string[] = []): NoteExtract {
  const tree = parser.parse(body);
  const runs: string[] = [];
  blocks(tree, runs);
  const headings: NoteExtract['headings'] = [];
  const visit = (node: Node) => {
    if (node.type === 'heading') headings.push({ depth: node.depth, text: textOf(node).trim() });
    else if ('children' in node) node.children.forEach(visit);
  };
  visit(tree);
  const codes = [...new Set(runs.flatMap((r) => findDtcsInText(r).map((d) => d.full)))];
  const known = new Set(caseCodes.flatMap((c) => [c, c.slice(0, 5)]));
  return {
    codes,
    suggestedCodes: codes.filter((c) => !known.has(c) && !known.has(c.slice(0, 5))),
    measurements: runs.flatMap((r) => findMeasurements(r)).map((m) => ({ value: m.value, unit: m.unit, raw: m.raw })),
    headings,
  };
}
