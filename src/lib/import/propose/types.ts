/** The shapes a mapping proposal returns. */
import type { HeaderChannel } from './channels';
import type { CellKind } from './sniff';
import type { MeterMapping, MeterMappingInput } from '../mapping-schema';
import type { ImportProblem } from '../problems';

export type Confidence = 'high' | 'medium' | 'low';

export interface ProposalChoice {
  /** Dotted path in the mapping, e.g. `timestamp.stampAt`. */
  field: string;
  value: unknown;
  confidence: Confidence;
  note: string;
}

export interface ProposalNeed {
  field: string;
  message: string;
  options: string[];
}

export interface ColumnProfile {
  /** 1-based position. */
  index: number;
  header: string;
  /** What most data cells look like. */
  kind: CellKind;
  samples: string[];
  role: HeaderChannel['role'] | 'timestamp' | 'date' | 'time' | 'meter-id' | null;
  unit: string | null;
}

export interface PreviewRow {
  row: number;
  /** The stamp as written, read as a UTC instant (interval-ending stamps not yet moved to the start). */
  stampUtc: string;
  meters: { meterId: string; active: number | null; reactive: number | null; reactiveLead: number | null }[];
}

export interface MappingProposal {
  /** False when the head cannot be read at all (empty, binary, header only...). */
  ok: boolean;
  problems: ImportProblem[];
  /** The complete mapping when nothing is left to state; null otherwise. */
  mapping: MeterMapping | null;
  /** The best guess so far, possibly incomplete; the form starts from it. */
  draft: Partial<MeterMappingInput>;
  choices: ProposalChoice[];
  needs: ProposalNeed[];
  columns: ColumnProfile[];
  /** The first rows read with `mapping` (empty when the mapping is incomplete), and their problems. */
  preview: { rows: PreviewRow[]; problems: ImportProblem[] };
}

export interface ProposeOptions {
  /** The site's IANA zone, proposed for local stamps. */
  timeZone?: string;
  /** The user's statement of the date order, when already made. */
  dateOrder?: 'ymd' | 'dmy' | 'mdy';
  /** Whether `headText` was cut from a longer file (the last partial line is ignored). Default: true unless it ends with a newline. */
  truncated?: boolean;
  /** Rows in the preview (default 10). */
  previewRows?: number;
}

