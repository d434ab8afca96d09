/**
 * The shapes of the batch endpoints of the Scarpline API (apps/api/src/services/batches.ts,
 * events.ts, exports.ts, reviews.ts, review-requests.ts).
 */
import type { Message } from '@scarpline/core/input';
import type { CaseKind, Warning } from '@scarpline/core/result';
import type { JobState, Verdict } from '@scarpline/core/verdict';
import type { UserRef } from '../core/models';
import type { ReviewState, ReviewSummary } from '../reviews/review-types';
import type { ProbabilitySummary } from '../studies/study-types';
import type { Units } from './scales';

export type BatchStatus = 'running' | 'done';
/** The state of a section's job: the core's job states (queued, running, done, failed). */
export type SectionStatus = JobState;
/** The verdict of a result: the core's codes (meets, below, no-fs, no-requirement, no-slope, input-error). */
export type { Verdict };
/** The kind of a design case: the core's CASE_KINDS (end-of-construction, long-term, …). */
export type { CaseKind };

/** How far a batch has come (services/batches.ts `progress`). */
export interface BatchProgress {
  total: number;
  done: number;
  failed: number;
  queued: number;
  running: number;
  /** Sections whose current result is below their required FS. */
  belowRequiredFs: number;
  /** (done + failed) / total; 1 for an empty batch. */
  fraction: number;
  /** Sections wait and no worker is alive to take them (the API's heartbeats tell). */
  stalled: boolean;
}

/** GET /batches/:id and each item of GET /projects/:id/batches. */
export interface Batch {
  id: number;
  projectId: number;
  /** The id written in the batch file (or the first section's id for loose section files). */
  name: string;
  title: string | null;
  status: BatchStatus;
  /** How it came in: json, upload, seed … */
  source: string;
  /** The user id of who submitted it. */
  submittedBy: number;
  /** Who submitted it (views.ts `userRef`). */
  submitter: UserRef;
  createdAt: string;
  finishedAt: string | null;
  progress: BatchProgress;
  review: ReviewSummary;
  /**
   * Every design case named in the batch, in the order first seen (one for a batch of
   * sections without cases); absent from an API before design cases.
   */
  cases?: string[];
  /** Done sections by case and verdict: `{ 'long term': { meets: 58, below: 3 } }`. */
  caseCounts?: Record<string, Partial<Record<Verdict, number>>>;
  caution: string;
}

/**
 * POST /projects/:id/batches and /projects/:id/uploads answer the batch and the input's
 * warnings: the core's located messages as they are.
 */
export interface SubmittedBatch extends Batch {
  warnings: Message[];
}

/** A GeoJSON geometry as the corridor gave it (LineString for a section line). */
export interface Geometry {
  type: string;
  coordinates?: unknown;
}

/** One design case of a listed section's result. */
export interface SectionListCase {
  name: string;
  kind: CaseKind;
  verdict: Verdict;
  governingMethod: string | null;
  governingFs: number | null;
  requiredFs: number | null;
  /** governingFs / requiredFs; null without either, or with no significant slope. */
  ratio: number | null;
}

/**
 * The current result of a listed section: the station's verdict over every case, and the
 * governing case's method, FS and required FS.
 */
export interface SectionListResult {
  verdict: Verdict;
  governingMethod: string | null;
  governingFs: number | null;
  requiredFs: number | null;
  warnings?: Warning[];
  /** The case with the lowest FS / required FS; absent from an API before design cases. */
  governingCase?: string | null;
  /** The governing case's FS / required FS. */
  ratio?: number | null;
  /** Every case of the station, in the order the section lists them. */
  cases?: SectionListCase[];
}

/** One item of GET /batches/:id/sections. */
export interface SectionListItem {
  id: number;
  /** The section's id in the input (`<batch id>@<station>` in a corridor). */
  key: string;
  station: number | null;
  /** The chainage in the units of the section's file, e.g. 1+240 (si) or 150+00 (us). */
  stationLabel?: string | null;
  /** The section's title as its input gives it. */
  title: string;
  /** The units of the section's file: chainage, lengths and plan coordinates are in these. */
  units: Units;
  status: SectionStatus;
  run: number;
  failReason: string | null;
  reviewState: ReviewState;
  geometry?: Geometry | null;
  result: SectionListResult | null;
  /**
   * The probability of failure of each case, when the section (or its corridor's template)
   * has a probability block on the critical surface; absent from an API before it.
   */
  probability?: ProbabilitySummary[] | null;
}

export interface SectionPage {
  page: number;
  pageSize: number;
  total: number;
  items: SectionListItem[];
  caution: string;
}

export type SectionSort = 'station' | 'fs' | 'ratio';

/** The query of GET /batches/:id/sections (pages count from 1; pageSize at most 500). */
export interface SectionQuery {
  sort?: SectionSort;
  order?: 'asc' | 'desc';
  page?: number;
  pageSize?: number;
  status?: SectionStatus;
  verdict?: Verdict;
  /** With `verdict`: the sections whose case of this name has that verdict. */
  case?: string;
}

/**
 * The properties of one feature of GET /batches/:id/results.geojson: the core's results table
 * (schemas/export-table.schema.json), then the service's own columns.
 */
export interface ResultProperties {
  station: number | null;
  /**
   * Where the corridor names its projected system: that system (an EPSG code or a proj4
   * definition) and the section line's positions in it; the geometry is then WGS 84 (RFC 7946).
   */
  crs?: string;
  projected_coordinates?: unknown;
  /** The station as chainage in the section's units (1+240, 150+00). */
  chainage: string | null;
  /** The section's id in the input (`<batch id>@<station>`): the key of a listed section. */
  section_id: string;
  /**
   * A row of one design case, or the station's row (the governing case, the station's
   * verdict) after its cases; absent from an API before design cases (a station's row).
   */
  row?: 'case' | 'station';
  case: string | null;
  kind?: CaseKind | null;
  governing_method: string | null;
  /** To three decimals. */
  fs: number | null;
  required_fs: number | null;
  /** fs / required_fs. */
  ratio?: number | null;
  verdict: Verdict | null;
  warnings: number | null;
  note: string | null;
  caution: string;
  review_state: ReviewState;
  job_state: SectionStatus;
}

export interface ResultFeature {
  type: 'Feature';
  id: string;
  geometry: Geometry | null;
  properties: ResultProperties;
}

export interface ResultCollection {
  type: 'FeatureCollection';
  name: string;
  caution: string;
  features: ResultFeature[];
}

/** The payload of the `done` event of GET /batches/:id/events. */
export interface BatchDoneEvent {
  id: number;
  status: BatchStatus;
  finishedAt: string | null;
  progress: BatchProgress;
  caution: string;
}

/** POST /batches/:id/review-requests. */
export interface ReviewRequestResult {
  batchId: number;
  requestedBy: number;
  recipients: string[];
  comment: string;
  /** false when no mail transport is configured. */
  sent: boolean;
  caution: string;
}

/** A file a batch was submitted with, kept in storage (GET /batches/:id/inputs). */
export interface StoredInput {
  id: number;
  kind: string;
  name: string;
  contentType: string;
  /** Bytes. */
  size: number;
  sha256: string;
  createdBy: number;
  creator: UserRef;
  createdAt: string;
}

/** A file fetched for saving, with the name the API gave it (shared/download.ts). */
export type { Download } from '../shared/download';
