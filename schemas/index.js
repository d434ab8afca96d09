// The JSON Schemas of Scarpline, for code that imports them as modules (core, API, web).
const sectionSchema = require('./section.schema.json');
const batchSchema = require('./batch.schema.json');
const resultSchema = require('./result.schema.json');
const exportTableSchema = require('./export-table.schema.json');

module.exports = { sectionSchema, batchSchema, resultSchema, exportTableSchema };
