/**
 * One table look for every list: on a wide screen the columns stay and the table scrolls sideways with
 * its actions kept in view; on a phone each row becomes a stacked card of "column: value" lines.
 */
export function tableLayout(wide: boolean): {
  scrollable?: boolean;
  responsiveLayout?: 'scroll' | 'stack';
  breakpoint?: string;
} {
  return wide ? { scrollable: true } : { responsiveLayout: 'stack', breakpoint: '760px' };
}
