export { SpanMark, UNKNOWN_TYPE_COLOR } from "./span-mark";
export { SpanText, pieceText, useSpanStyles } from "./span-text";
export { typeCode, typeCodes } from "./type-codes";
export { TypeKey } from "./type-key";
export { excerptBounds } from "./excerpt";
