/** What the search API answers, as the search island reads it. */
import type { GoalResult } from '../fit';
import type { Category, Condition, Hazard, Region } from '../listings/constants';
import type { Facets } from './facets';

export interface ListingSummary {
  id: string;
  title: string;
  category: Category;
  priceCents: number;
  currency: string;
  quantity: number;
  labName: string;
  condition: Condition;
  shipsTo: Region[];
  hasMeasurements: boolean;
  photoId: string | null;
  hazards: Hazard[];
  exportControlled: boolean;
}

/** A small chart: the figure against one variable, the goal dashed. */
export interface PlotData {
  title: string;
  xLabel: string;
  yLabel: string;
  logX?: boolean;
  logY?: boolean;
  x: number[];
  series: { label: string; values: (number | null)[]; dashed?: boolean }[];
  markerX?: number;
}

export interface Detail {
  label: string;
  value: string;
}

/** The fit engine's result for one candidate, with what the result list needs to show it. */
export type ResultFit = Pick<
  GoalResult,
  'pass' | 'verdict' | 'figure' | 'worst' | 'goal' | 'headroom' | 'unit' | 'reasons' | 'notes' | 'formula' | 'source'
> & {
  /** "Predicted finesse", "Predicted measured squeezing", "Limiting figure: …". */
  figureLabel: string;
  /** Supporting figures: linewidth, g-parameters, waist; QE and clearance; each constraint. */
  details: Detail[];
  plot: PlotData | null;
};

export interface GoalSearchResult {
  listing: ListingSummary;
  /** two-listings: the second mirror of the pair. */
  partner?: ListingSummary;
  fit: ResultFit;
}

/** The goal turned into the spec a part needs, shown above the results. */
export interface Headline {
  label: string;
  value: string;
}

export interface GoalSearchResponse {
  results: GoalSearchResult[];
  total: number;
  page: number;
  pageSize: number;
  facets: Facets;
  headline: Headline[];
}

export interface TextSearchResult {
  listing: ListingSummary;
  score: number | null;
}

export interface TextSearchResponse {
  results: TextSearchResult[];
  total: number;
  page: number;
  pageSize: number;
  facets: Facets;
}
