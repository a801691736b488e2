// Cause trees: the authored files in content/trees, replaced per shop by a senior's edit
// (one row in cause_trees per shop and tree id). The YAML text is kept with the edit so
// the editor shows the senior's own comments and layout back.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { and, eq, isNotNull, isNull } from 'drizzle-orm';
import { parse, stringify } from 'yaml';
import { causeTrees, cases, users } from '../../db/schema';
import { listCauses, parseTree, removedCautions, TreeError, type Tree } from '../../shared/walk';
import type { TreeDetail, TreeSummary } from '../../shared/schemas/walks';
import type { SessionUser } from '../auth/session-user';
import type { AppContext } from '../context';
import { HttpError, notFound } from '../http/errors';

interface ContentTree {
  tree: Tree;
  yaml: string;
}

const cache = new Map<string, Map<string, ContentTree>>();

/** Every tree in content/trees, read and validated once per process (a broken file stops the read with its problems). */
export function contentTrees(root: string): Map<string, ContentTree> {
  const hit = cache.get(root);
  if (hit) return hit;
  const dir = path.join(root, 'content', 'trees');
  const trees = new Map<string, ContentTree>();
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.yaml')).sort()) {
    const yaml = readFileSync(path.join(dir, file), 'utf8');
    const tree = parseTree(parse(yaml));
    trees.set(tree.id, { tree, yaml });
  }
  cache.set(root, trees);
  return trees;
}

interface StoredDefinition {
  yaml?: string;
  tree?: unknown;
}

interface ShopEdit {
  tree: Tree;
  yaml: string;
  updatedAt: Date;
  updatedBy: { id: number; name: string };
}

async function shopEdits(ctx: AppContext, shopId: number, treeId?: string): Promise<Map<string, ShopEdit>> {
  const where = treeId ? and(eq(causeTrees.shopId, shopId), eq(causeTrees.treeId, treeId)) : eq(causeTrees.shopId, shopId);
  const rows = await ctx.db
    .select({ treeId: causeTrees.treeId, definition: causeTrees.definition, updatedAt: causeTrees.updatedAt, byId: users.id, byName: users.name })
    .from(causeTrees)
    .innerJoin(users, eq(users.id, causeTrees.updatedById))
    .where(where);
  const edits = new Map<string, ShopEdit>();
  for (const row of rows) {
    const def = row.definition as StoredDefinition;
    try {
      // Stored edits were validated on save; a tree format change could still make one stale.
      const tree = parseTree(def.tree ?? parse(def.yaml ?? ''));
      edits.set(row.treeId, { tree, yaml: def.yaml ?? stringify(def.tree), updatedAt: row.updatedAt, updatedBy: { id: row.byId, name: row.byName } });
    } catch (error) {
      ctx.log.warn({ err: error, treeId: row.treeId, shopId }, 'stored cause tree no longer validates; using the authored file');
    }
  }
  return edits;
}

/** The trees a shop walks: authored files, each replaced by the shop's edit where there is one. */
export async function treesForShop(ctx: AppContext, shopId: number): Promise<Tree[]> {
  const edits = await shopEdits(ctx, shopId);
  return [...contentTrees(ctx.config.root).values()].map(({ tree }) => edits.get(tree.id)?.tree ?? tree);
}

function summary(tree: Tree, edit: ShopEdit | undefined): TreeSummary {
  return {
    id: tree.id,
    title: tree.title,
    description: tree.description,
    systems: [...new Set(tree.branches.map((b) => b.system))],
    causes: listCauses(tree).length,
    codes: tree.appliesTo.codes,
    symptoms: tree.appliesTo.symptoms,
    source: edit ? 'shop' : 'content',
    updatedAt: edit ? edit.updatedAt.toISOString() : null,
    updatedBy: edit ? edit.updatedBy : null,
  };
}

export async function listTrees(ctx: AppContext, shopId: number): Promise<TreeSummary[]> {
  const edits = await shopEdits(ctx, shopId);
  return [...contentTrees(ctx.config.root).values()]
    .map(({ tree }) => summary(edits.get(tree.id)?.tree ?? tree, edits.get(tree.id)))
    .sort((a, b) => a.title.localeCompare(b.title));
}

export async function getTree(ctx: AppContext, shopId: number, treeId: string): Promise<TreeDetail> {
  const authored = contentTrees(ctx.config.root).get(treeId);
  if (!authored) throw notFound('That cause tree');
  const edit = (await shopEdits(ctx, shopId, treeId)).get(treeId);
  const tree = edit?.tree ?? authored.tree;
  return { ...summary(tree, edit), tree, yaml: edit?.yaml ?? authored.yaml };
}

/** zod's "Invalid input: expected string, received undefined" in workshop words. */
const plainProblem = (p: string) => p.replace(/Invalid input: expected (\w+), received undefined/, 'missing (a $1 is required here)');

const invalidTree = (problems: string[]) =>
  new HttpError(400, 'invalid_tree', `The tree is not valid: ${problems.length} problem${problems.length === 1 ? '' : 's'} to fix.`, undefined, { problems });

function readYaml(text: string): unknown {
  try {
    return parse(text, { prettyErrors: true });
  } catch (error) {
    const message = error instanceof Error ? error.message.split('\n')[0] : 'the YAML could not be read';
    throw invalidTree([`(yaml): ${message}`]);
  }
}

/** Cause ids the shop's cases point at: removing one would orphan the shop's history (content/trees/README.md). */
async function usedCauseIds(ctx: AppContext, shopId: number, treeId: string): Promise<Set<string>> {
  const rows = await ctx.db
    .selectDistinct({ cause: cases.cause })
    .from(cases)
    .where(and(eq(cases.shopId, shopId), isNotNull(cases.cause), isNull(cases.deletedAt)));
  return new Set(rows.map((r) => r.cause ?? '').filter((c) => c.startsWith(`${treeId}/`)));
}

/** Replace a tree for this shop with a senior's YAML; every problem is listed at once. */
export async function saveTree(ctx: AppContext, actor: SessionUser, treeId: string, yaml: string): Promise<TreeDetail> {
  const authored = contentTrees(ctx.config.root).get(treeId);
  if (!authored) throw notFound('That cause tree');
  let tree: Tree;
  try {
    tree = parseTree(readYaml(yaml));
  } catch (error) {
    if (error instanceof TreeError) throw invalidTree(error.problems.map(plainProblem));
    throw error;
  }
  if (tree.id !== treeId) throw invalidTree([`id: the tree id must stay "${treeId}" (it is "${tree.id}")`]);
  const cautionsCut = removedCautions(authored.tree, tree);
  if (cautionsCut.length) throw invalidTree(cautionsCut);
  const kept = new Set(listCauses(tree).map((c) => c.globalId));
  const orphaned = [...(await usedCauseIds(ctx, actor.shopId, treeId))].filter((id) => !kept.has(id)).sort();
  if (orphaned.length) {
    throw invalidTree(orphaned.map((id) => `branches: cause "${id}" is the confirmed cause of cases in this shop; keep its id (change its title or text instead)`));
  }
  const definition = { yaml, tree } as unknown as Record<string, unknown>;
  await ctx.db
    .insert(causeTrees)
    .values({ shopId: actor.shopId, treeId, definition, updatedById: actor.id })
    .onDuplicateKeyUpdate({ set: { definition, updatedById: actor.id, updatedAt: new Date() } });
  return getTree(ctx, actor.shopId, treeId);
}
