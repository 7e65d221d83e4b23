// Shapes the journey endpoints answer with that shared/ does not name yet (see server/routes/journeys.ts).
import type { HarImportEntry } from '../../shared/journey/har-import';
import type { JourneyDocument, JourneyDocumentInput } from '../../shared/journey/journey-schema';
import type { RunResult, StepResult, Verdict } from '../../shared/journey/run-result';
import type { RunSummary } from '../../shared/schemas/journeys';

export interface JourneyVersionView {
  version: number;
  createdAt: string;
  createdBy: string | null;
}

export interface VantageStateView {
  vantage: string;
  verdict: Verdict;
  slotAt: string;
}

/** GET /api/journeys/:id */
export interface JourneyDetail {
  id: number;
  name: string;
  /** The version shown (the current one unless ?version= asked for another). */
  version: number;
  enabled: boolean;
  document: JourneyDocument;
  serviceIds: number[];
  createdAt: string;
  updatedAt: string;
  versions: JourneyVersionView[];
  vantageStates: VantageStateView[];
}

/** POST/PUT /api/journeys answer: the saved journey without versions and states. */
export type SavedJourney = Omit<JourneyDetail, 'versions' | 'vantageStates'>;

/** One step of one run in GET /api/journeys/:id/timings; void runs have no step (null fields). */
export interface TimingPoint {
  runId: number;
  slotAt: string;
  verdict: Verdict;
  vantage: string;
  step: number | null;
  stepName: string | null;
  totalMs: number | null;
}

export interface RunDetail extends RunSummary {
  steps: StepResult[];
}

export interface RunsPage {
  items: RunSummary[];
  nextCursor: string | null;
}

export interface RunsFilter {
  verdict?: Verdict;
  vantage?: string;
}

export interface TryAnswer {
  result: RunResult;
}

/** POST /api/journeys/import-har */
export interface HarImportAnswer {
  entries: HarImportEntry[];
  draft: JourneyDocumentInput;
  warnings: string[];
  /** Credentials found in the recording, already stored encrypted under these names. */
  secrets: { name: string; source: string }[];
}
