/**
 * Varledger's CSV import library: interval-meter exports and bill histories.
 * Framework-free: the caller passes the file as an (async) iterable of byte or text chunks.
 */
export { parseMeterCsv, type MeterImportOptions, type MeterImportResult, type ParsedMeter, type QualityReport } from './parse-meter-csv';
export { proposeMapping, type MappingProposal, type ProposalChoice, type ProposalNeed, type ProposeOptions, type ColumnProfile, type PreviewRow } from './propose/propose-mapping';
export { MeterMappingSchema, ChannelSetSchema, TimestampSchema, type MeterMapping, type MeterMappingInput, type ChannelSet, type ReactiveMapping, type TimestampMapping } from './mapping-schema';
export type { MeterQuality, Finding, Gap, RowCount, RowRange } from './quality';
export type { DstDay } from './dst-days';
export { type ImportProblem, type ImportFailure, type ProblemCode, MAX_PROBLEMS } from './problems';
export { readRecords, textChunks, fromWebStream, MAX_LINE_CHARS, type CsvSource, type ReadProgress } from './records';
export { meterMultiplier, unitFromHeader } from './units';
export { parseBillCsv, readAmount, readBillDate, type BillImportResult, type ParsedBill, type BillWarning } from './bills/parse-bill-csv';
export { BillDeterminantsSchema, BillMappingSchema, type BillDeterminants, type BillMapping, type BillMappingInput } from './bills/bill-schema';
