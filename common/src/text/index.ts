export { CONTROL_CHARACTER, isSingleLineText, printableLine, printableText, singleLineMessage } from './single-line.js';
