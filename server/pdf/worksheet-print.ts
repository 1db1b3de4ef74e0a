import type { Drill, RuleCard } from '../../shared/generator/index';

/** A tempo ladder: practise from `start` up (or down) to `target` in steps of `step` BPM. */
export interface TempoLadder {
  readonly start: number;
  readonly target: number;
  readonly step: number;
}

/** Which practice aids a drill prints beside its notation. */
export interface PrintAids {
  readonly sticking: boolean;
  readonly counts: boolean;
  readonly tension: boolean;
}

export interface WorksheetPrintDrill {
  readonly title: string;
  readonly card: RuleCard;
  readonly drill: Drill;
  /** Absolute URL of the page that shows this drill; printed as text and as a QR code. */
  readonly seedLink: string;
  readonly ladder: TempoLadder;
  readonly aids: PrintAids;
}

export interface PrintLogo {
  readonly bytes: Buffer;
  readonly mime: 'image/png' | 'image/jpeg';
}

/** Everything a printed worksheet shows, gathered by its caller (no I/O in the renderer). */
export interface WorksheetPrint {
  readonly title: string;
  readonly notes?: string;
  readonly studioName: string;
  readonly logo?: PrintLogo;
  /** ISO day (YYYY-MM-DD) printed in the header. */
  readonly date: string;
  readonly paper: 'a4' | 'letter';
  readonly drills: readonly WorksheetPrintDrill[];
}
