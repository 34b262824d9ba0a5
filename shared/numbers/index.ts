export { parseOptionalNumber, parseTypedNumber } from './typed-number'
