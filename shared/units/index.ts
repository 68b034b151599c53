export { parseQuantity, type ParseResult } from './parse';
export { formatEngineering, significantText } from './format';
export { checkRange } from './range';
export { UNIT_KINDS, type UnitKindInfo } from './kinds';
