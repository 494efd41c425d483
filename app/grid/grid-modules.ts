"use client";
// Community modules only (see DEVELOPERS.md, Grid): selection, fill-down, paste and undo are our own.
import {
  CellApiModule,
  CellStyleModule,
  ClientSideRowModelModule,
  ColumnApiModule,
  RenderApiModule,
  RowApiModule,
  ScrollApiModule,
  DateFilterModule,
  InfiniteRowModelModule,
  ModuleRegistry,
  NumberFilterModule,
  PinnedRowModule,
  RowStyleModule,
  SelectEditorModule,
  TextEditorModule,
  TextFilterModule,
  TooltipModule,
  themeQuartz,
} from "ag-grid-community";

let registered = false;
export function registerGridModules(): void {
  if (registered) return;
  ModuleRegistry.registerModules([
    CellApiModule,
    ColumnApiModule,
    RenderApiModule,
    RowApiModule,
    ScrollApiModule,
    ClientSideRowModelModule,
    InfiniteRowModelModule,
    TextEditorModule,
    SelectEditorModule,
    TextFilterModule,
    NumberFilterModule,
    DateFilterModule,
    TooltipModule,
    PinnedRowModule,
    CellStyleModule,
    RowStyleModule,
  ]);
  registered = true;
}

/** Our own look: plain ink-on-paper, a teal accent, compact rows that fit a 1366 px laptop screen. */
export const gridTheme = themeQuartz.withParams({
  accentColor: "#0f6e6e",
  backgroundColor: "#fffdf8",
  foregroundColor: "#1d232a",
  headerBackgroundColor: "#ece6d8",
  headerTextColor: "#1d232a",
  oddRowBackgroundColor: "#f7f3ea",
  borderColor: "#cfc6b2",
  fontSize: 13,
  rowHeight: 30,
  headerHeight: 34,
  spacing: 5,
  wrapperBorderRadius: 4,
});
