/**
 * `@scarpline/core/input`: reading section and batch files (YAML, JSON, GeoJSON and LandXML corridors)
 * into normalised sections with located messages, the batch structure every caller reads,
 * and the inverse of normalisation that re-runs patch. Loads yaml and ajv (and mathjs for a
 * value written with its unit); not for the browser bundle (its types are).
 */
export { parseSections, type ParsedSections } from './input/parse-sections';
export {
  parseGeoJsonCorridor,
  isGeoJsonCorridor,
  type ParsedCorridor,
  type CorridorEntry,
  type CorridorFeature,
  type HeaderFile,
} from './input/geojson-corridor';
export { parseLandXmlCorridor, isLandXml, type ParsedLandXml } from './input/landxml-corridor';
export { formatMessage } from './input/format-message';
export { sectionDocument, readSectionDocument } from './input/section-document';
export type { Message, BatchHeader, SectionEntry } from './input/types';
export { normaliseSection } from './model/normalise-section';
export { INPUT_LIMITS, MAX_SECTIONS } from './input/limits';
export { screenText, type Refusal, type Screened } from './input/screen-text';
export { screenData, badCharacter, countValues } from './input/screen-data';
export { capMessages } from './input/cap-messages';
