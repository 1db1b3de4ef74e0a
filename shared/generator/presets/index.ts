import cubanStyleBass from './cuban-style-bass.json' with { type: 'json' };
import earlyBackbeat from './early-backbeat.json' with { type: 'json' };
import euclideanFiveInSixteen from './euclidean-five-in-sixteen.json' with { type: 'json' };
import fourOverThree from './four-over-three.json' with { type: 'json' };
import kickOffTheOne from './kick-off-the-one.json' with { type: 'json' };
import lateBackbeatOverTheBarLine from './late-backbeat-over-the-bar-line.json' with { type: 'json' };
import linearSixteenths from './linear-sixteenths.json' with { type: 'json' };
import quintupletsHihat134 from './quintuplets-hihat-1-3-4.json' with { type: 'json' };
import quintupletsHihat135 from './quintuplets-hihat-1-3-5.json' with { type: 'json' };
import rideWithFootOn2And4 from './ride-with-foot-on-2-and-4.json' with { type: 'json' };
import shuffleKickUpbeats from './shuffle-kick-upbeats.json' with { type: 'json' };
import tensionAndRelease from './tension-and-release.json' with { type: 'json' };
import lateBackbeat from './late-backbeat.json' with { type: 'json' };
import threeOffLandOnFour from './three-off-land-on-four.json' with { type: 'json' };
import sixEightGroove from './six-eight-groove.json' with { type: 'json' };
import twelveEightShuffle from './twelve-eight-shuffle.json' with { type: 'json' };
import sevenEightTwoTwoThree from './seven-eight-two-two-three.json' with { type: 'json' };
import grooveAndFill from './groove-and-fill.json' with { type: 'json' };

/**
 * A rule card that ships with Tensile. `card` is the raw card as a teacher would write it; pass it
 * through `parseRuleCard` before generating.
 */
export interface BuiltInPreset {
  id: string;
  title: string;
  summary: string;
  card: unknown;
}

/** The built-in rule cards, in the order a lesson plan might take them. */
export const BUILT_IN_PRESETS: readonly BuiltInPreset[] = [
  kickOffTheOne,
  threeOffLandOnFour,
  earlyBackbeat,
  lateBackbeat,
  lateBackbeatOverTheBarLine,
  rideWithFootOn2And4,
  linearSixteenths,
  cubanStyleBass,
  shuffleKickUpbeats,
  fourOverThree,
  quintupletsHihat135,
  quintupletsHihat134,
  euclideanFiveInSixteen,
  tensionAndRelease,
  grooveAndFill,
  sixEightGroove,
  twelveEightShuffle,
  sevenEightTwoTwoThree,
];

/** The built-in preset with this id, or undefined. */
export function findBuiltInPreset(id: string): BuiltInPreset | undefined {
  return BUILT_IN_PRESETS.find((preset) => preset.id === id);
}
