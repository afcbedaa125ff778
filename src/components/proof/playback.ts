/** A counterexample or witness the Proof tab hands to the player over the field panel. */
import type { CheckScript } from '@shared/checks';

export interface Playback {
  script: CheckScript;
  title: string;
  /** A witness of "can happen" rather than a counterexample. */
  witness: boolean;
}
