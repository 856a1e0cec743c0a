export { dimensions, type Dimension, type DimensionName } from './dimensions';
export { formatQuantity, siPrefixes, type FormatOptions } from './format';
export { parseQuantity, type ParsedQuantity } from './parse';
