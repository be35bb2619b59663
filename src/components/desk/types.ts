// What the desk islands receive from the pages and the JSON API (the server's ownerShape and
// file shape as JSON; islands never import server modules, so the shapes are restated here).
import type { Category, Condition, FileKind, ListingStatus, MeasurementKind, Region } from '../../lib/listings/constants';
import type { MeasurementData } from '../../lib/measurements';

export interface DeskListing {
  id: string;
  labId: string;
  category: Category;
  status: ListingStatus;
  title: string;
  description: string;
  condition: Condition;
  quantity: number;
  priceCents: number;
  currency: string;
  shipsTo: Region[];
  specs: Record<string, unknown>;
  reviewReason: string | null;
  version: number;
  /** The last approved version, still what buyers see while an edit waits in review. */
  published: { approvedAt: number } | null;
  submittedAt: string | null;
  updatedAt: string;
  createdAt: string;
}

export interface DeskFile {
  id: string;
  kind: FileKind;
  measurementKind: MeasurementKind | null;
  filename: string;
  contentType: string;
  size: number;
  width: number | null;
  height: number | null;
  data: MeasurementData | null;
}

export interface LabOption {
  id: string;
  name: string;
}
