/** A JSON Schema (draft 2020-12) document as plain data. */
export interface JsonSchemaDocument {
  $schema: string;
  $id: string;
  title: string;
  description: string;
  [keyword: string]: unknown;
}

/** The section file schema (schemas/section.schema.json). */
export declare const sectionSchema: JsonSchemaDocument;

/** The corridor batch schema (schemas/batch.schema.json); it refers to the section schema. */
export declare const batchSchema: JsonSchemaDocument;

/** The section result schema (schemas/result.schema.json): what analyzeSection returns. */
export declare const resultSchema: JsonSchemaDocument;

/**
 * The results table of a corridor (schemas/export-table.schema.json): a row of results.csv, or
 * the properties of a results.geojson feature; it refers to the result schema.
 */
export declare const exportTableSchema: JsonSchemaDocument;
