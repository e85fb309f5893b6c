import { themeQuartz } from 'ag-grid-community';

/** The cleaning grid in Tallywise's own colours: warm paper, ink text, teal accent, no web fonts. */
export const recordsGridTheme = themeQuartz.withParams({
  fontFamily: 'inherit',
  fontSize: 13,
  headerFontSize: 12,
  headerFontWeight: 600,
  accentColor: '#0f6e73',
  backgroundColor: '#fffdf8',
  foregroundColor: '#1f2a2e',
  headerBackgroundColor: '#efece4',
  headerTextColor: '#1f2a2e',
  oddRowBackgroundColor: '#faf7f0',
  rowHoverColor: '#f0ebdd',
  selectedRowBackgroundColor: '#d7ebe9',
  borderColor: '#d9d4c7',
  wrapperBorderRadius: 6,
  rowHeight: 30,
  headerHeight: 34,
  spacing: 5,
});
