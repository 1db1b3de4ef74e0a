import {
  AvoidDownbeatRuleSchema,
  BackbeatRuleSchema,
  EuclidRuleSchema,
  FillHolesRuleSchema,
  LayerSchema,
  LinearRuleSchema,
  MeterSchema,
  OstinatoSchema,
  PhraseRuleSchema,
  PolyrhythmRuleSchema,
  RawRuleCardSchema,
  StickingSchema,
  SwingSchema,
  TensionRuleSchema,
} from './schema';

/** The field names a card accepts at each place, for "did you mean" hints. */
const RULE_FIELDS: Record<string, readonly string[]> = {
  backbeat: Object.keys(BackbeatRuleSchema.shape),
  avoidDownbeat: Object.keys(AvoidDownbeatRuleSchema.shape),
  fillHoles: Object.keys(FillHolesRuleSchema.shape),
  linear: Object.keys(LinearRuleSchema.shape),
  polyrhythm: Object.keys(PolyrhythmRuleSchema.shape),
  euclid: Object.keys(EuclidRuleSchema.shape),
  tension: Object.keys(TensionRuleSchema.shape),
  phrase: Object.keys(PhraseRuleSchema.shape),
};

const FIELDS_AT: Record<string, readonly string[]> = {
  '': Object.keys(RawRuleCardSchema.shape),
  meter: Object.keys(MeterSchema.shape),
  ostinato: Object.keys(OstinatoSchema.shape),
  layers: Object.keys(LayerSchema.shape),
  sticking: Object.keys(StickingSchema.shape),
  swing: Object.keys(SwingSchema.shape),
};

/** Fields allowed in the object at `path` (a rule's depend on its kind). */
export function knownFields(
  path: readonly PropertyKey[],
  ruleKind: string | null,
): readonly string[] {
  const [top] = path;
  if (top === 'rules') return ruleKind ? (RULE_FIELDS[ruleKind] ?? []) : [];
  return FIELDS_AT[typeof top === 'string' ? top : ''] ?? [];
}

/** "Unknown field "tempoo": did you mean "tempo"?" */
export function unknownFieldMessage(key: string, known: readonly string[]): string {
  const near = closest(key, known);
  const hint = near
    ? ` Did you mean "${near}"?`
    : known.length > 0
      ? ` Allowed here: ${known.map((k) => `"${k}"`).join(', ')}.`
      : '';
  return `Unknown field "${key}".${hint}`;
}

function closest(key: string, known: readonly string[]): string | null {
  let best: string | null = null;
  let bestDistance = Infinity;
  for (const candidate of known) {
    const d = editDistance(key.toLowerCase(), candidate.toLowerCase());
    if (d < bestDistance) {
      best = candidate;
      bestDistance = d;
    }
  }
  // A hint only when the names are close: a third of the name may differ.
  return best !== null && bestDistance <= Math.max(2, Math.floor(best.length / 3)) ? best : null;
}

/** Levenshtein distance (insert, delete, substitute: one each). */
export function editDistance(a: string, b: string): number {
  let row = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const next = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      next.push(Math.min((row[j] ?? 0) + 1, (next[j - 1] ?? 0) + 1, (row[j - 1] ?? 0) + cost));
    }
    row = next;
  }
  return row[b.length] ?? 0;
}
