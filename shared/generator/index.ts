/**
 * Tensile's drill engine: the only module the app and the server import.
 *
 * `parseRuleCard(input)` validates a rule card; `generateDrill(card, seed)` turns it into a
 * reproducible drill; `checkDrill(card, drill)` verifies a drill against its card;
 * `measureTension(bar)` is the bar's syncopation in 0..1.
 */
export { parseRuleCard } from './parse';
export { generateDrill } from './generate';
export type { GenerateOptions } from './keep';
export { checkDrill, type Violation } from './rules/checker';
export { measureTension } from './tension';
export { ENGINE_VERSION } from './version';
export {
  RuleCardError,
  RuleConflictError,
  SearchExhaustedError,
  type RuleCardIssue,
} from './errors';
export { FOOT_LIMITS, HAND_LIMITS, type StrokeLimits } from './hands';
export {
  VOICE_IDS,
  FOOT_VOICES,
  HIT_SOURCES,
  isHandVoice,
  type Drill,
  type DrillBar,
  type DrillHit,
  type Dynamic,
  type Hand,
  type HitSource,
  type VoiceId,
} from './drill';
export {
  RawRuleCardSchema,
  type RuleCard,
  type Rule,
  type RuleKind,
  type BackbeatRule,
  type AvoidDownbeatRule,
  type FillHolesRule,
  type LinearRule,
  type PolyrhythmRule,
  type EuclidRule,
  type TensionRule,
  type Ostinato,
  type Meter,
  type PhraseRule,
  type Layer,
  type Sticking,
  type Swing,
  type VoiceRole,
  VOICE_ROLES,
} from './schema';
export { defaultGrouping, isCompound } from './meter';
export { defaultRole, type RoleSource } from './roles';
export { drillDifficulty, cardVariant, type Difficulty } from './difficulty';
