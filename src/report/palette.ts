// Series colours: the colour-blind-safe palette of M. Okabe and K. Ito,
// "Color Universal Design (CUD): how to make figures and presentations that
// are friendly to colorblind people", J*FLY, 2002 (2008 revision); hex values
// from memory. Yellow
// (#F0E442) is left out: it is unreadable on white. Order chosen so the first
// two colours (blue, vermillion) differ for every common colour-vision type.

/**
 * Default series colours, used in turn.
 *
 * @example
 * ```ts
 * const color = SERIES_PALETTE[i % SERIES_PALETTE.length];
 * ```
 */
export const SERIES_PALETTE: readonly string[] = Object.freeze([
  '#0072B2', // blue
  '#D55E00', // vermillion
  '#009E73', // bluish green
  '#CC79A7', // reddish purple
  '#E69F00', // orange
  '#56B4E9', // sky blue
  '#000000', // black
]);

/**
 * Default colour of reference lines (a dark red that reads as "limit").
 *
 * @example
 * ```ts
 * const color = ref.color ?? REFERENCE_COLOR;
 * ```
 */
export const REFERENCE_COLOR = '#A4161A';

/**
 * Whether `color` is a CSS colour we accept: `#rgb`, `#rgba`, `#rrggbb`,
 * `#rrggbbaa`, a colour name, or an `rgb()`/`rgba()`/`hsl()`/`hsla()` call with
 * numbers only. Anything else is refused, so a colour can never carry markup
 * or script into the page.
 *
 * @example
 * ```ts
 * isSafeColor('#0072B2'); // true
 * isSafeColor('red" onload="x'); // false
 * ```
 */
export function isSafeColor(color: string): boolean {
  return (
    /^#(?:[0-9a-f]{3,4}|[0-9a-f]{6}|[0-9a-f]{8})$/i.test(color) ||
    /^[a-z]{3,20}$/i.test(color) ||
    /^(?:rgba?|hsla?)\(\s*[-+0-9.%\s,/deg]*\)$/i.test(color)
  );
}
