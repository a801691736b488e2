export { WalkError, TreeError, type WalkErrorCode } from './errors';
export {
  codeMatches,
  emptyEvidence,
  misfirePatterns,
  misfiringCylinders,
  normaliseCode,
  normalisePlatformValue,
  normaliseTag,
  FUELS,
  INDUCTIONS,
  LAYOUTS,
  MISFIRE_PATTERNS,
  type MisfirePattern,
  type WalkEvidence,
  type WalkPlatform,
} from './evidence';
export {
  causeSchema,
  conditionSchema,
  globalCauseId,
  listCauses,
  parseTree,
  specSchema,
  treeSchema,
  SCOPES,
  SYSTEMS,
  type Cause,
  type Condition,
  type Scope,
  type System,
  type Tree,
  type TreeCause,
  type TreeSpec,
} from './tree-schema';
export { conditionHolds } from './conditions';
export { selectTrees, SELECT_POINTS, type TreeMatch } from './select';
export { priorsFor, SCOPE_RULES, type CaseId, type CaseRef, type CausePrior, type TestInstructions } from './priors';
export { caseWeight, learnFromCases, DEFAULT_STRENGTH, PRECEDENT_COUNT, SHARPNESS, type ConfirmedCase, type LearnOptions } from './learn';
export { compareByRatio, expectedCost, expectedMinutes, orderSteps, type ExpectedMinutes, type Orderable, type StepState } from './order';
export { markStep, refreshWalk, startWalk, type StartOptions, type Step, type StepMark, type StepOutcome, type Walk } from './walk';
export { measurementSchema, stepMarkSchema, walkCreateSchema, walkStateSchema, type StepMarkInput, type WalkCreate } from './api-schemas';
export { buildWriteUp } from './write-up';
export { caseSimilarity, codeSimilarity, FAMILY_CREDIT, SIMILARITY_WEIGHTS, type SimilarityInput } from './similarity';
export { isSameMark } from './same-mark';
export { cautionBody, composeCaution, removedCautions, stepCaution, situationalCautions, DEFERRAL, EXHAUST_CAUTION, HYBRID_CAUTION, ROAD_TEST_CAUTION } from './cautions';
export { MAX_PRECEDENTS, pickPrecedents, PRECEDENT_MIN_SIMILARITY, type Precedent, type PrecedentCandidate } from './precedents';
export { evidenceFrom, scoreHistory, type EvidenceParts, type HistoryCase } from './history';
export { AUTO_LINK, clearSuggestion, contentStems, suggestCauses, SUGGEST_WEIGHTS, type CauseSuggestion, type CaseText } from './suggest';
