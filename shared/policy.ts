// Who may do what. The server enforces this table on every route; the client reads it to
// decide which actions to offer. Per-record rules (shop, drafts, authorship) are functions below.
import { atLeast, type CaseStatus, type Role } from './roles';

export type Access = 'public' | 'signed-in' | Role;

export const policy = {
  'auth.public': 'public',
  'auth.self': 'signed-in',
  'health.read': 'public',
  'users.manage': 'manager',
  'outbox.read': 'manager',
  'shop.settings': 'manager',
  'cases.read': 'apprentice',
  'cases.write': 'apprentice',
  'cases.review': 'senior',
  'cases.delete': 'senior',
  'platforms.read': 'apprentice',
  'platforms.manage': 'senior',
  'codes.read': 'apprentice',
  'search.read': 'apprentice',
  'home.read': 'apprentice',
  'walks.use': 'apprentice',
  'trees.manage': 'senior',
  'patterns.read': 'senior',
  'digest.send': 'manager',
} as const satisfies Record<string, Access>;

export type Permission = keyof typeof policy;

export interface Actor {
  id: number;
  role: Role;
  shopId: number;
}

export function allows(actor: Actor | null, permission: Permission): boolean {
  const access: Access = policy[permission];
  if (access === 'public') return true;
  if (!actor) return false;
  if (access === 'signed-in') return true;
  return atLeast(actor.role, access);
}

export const isSeniorOrAbove = (actor: Actor) => atLeast(actor.role, 'senior');

/** Drafts are seen by their author and by seniors and managers; everything else by the shop. */
export function canSeeCase(actor: Actor, record: { authorId: number; status: CaseStatus }): boolean {
  return record.status !== 'draft' || record.authorId === actor.id || isSeniorOrAbove(actor);
}

/** Published cases are edited only by seniors and managers; drafts and reviews also by their author. */
export function canEditCase(actor: Actor, record: { authorId: number; status: CaseStatus }): boolean {
  if (isSeniorOrAbove(actor)) return true;
  return record.status !== 'published' && record.authorId === actor.id;
}

export const canPublish = isSeniorOrAbove;
export const canConfirmFix = isSeniorOrAbove;
