import { parseRuleCard } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { presetViews, type PresetView } from './presets-router';

/** The engine's built-in rule cards as the API lists them. */
export function builtInPresetViews(): PresetView[] {
  return presetViews(BUILT_IN_PRESETS, parseRuleCard);
}
