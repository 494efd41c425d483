// The small UI kit every screen is written on: tables, record headers, forms, state marks, cautions.
export { DataTable } from "@/app/_ui/kit/data-table";
export type { Column } from "@/app/_ui/kit/data-table";
export { PlainTable } from "@/app/_ui/kit/plain-table";
export type { PlainColumn } from "@/app/_ui/kit/plain-table";
export { codePart, historyPart, statusPart } from "@/app/_ui/kit/plain-cell";
export type { PlainCell, PlainCellPart } from "@/app/_ui/kit/plain-cell";
export { RecordHeader } from "@/app/_ui/kit/record-header";
export { StatusMark, statusFamily } from "@/app/_ui/kit/status-mark";
export { Cautions } from "@/app/_ui/kit/cautions";
export { ConfidenceMark } from "@/app/_ui/kit/confidence-mark";
export { RowsForm } from "@/app/_ui/kit/rows-form";
export { FormMessage } from "@/app/_ui/kit/form-message";
export type { RowColumn, RowField, RowValues } from "@/app/_ui/kit/rows-form";
export { TableHead, numeric } from "@/app/_ui/kit/table-head";
export type { Heading } from "@/app/_ui/kit/table-head";
