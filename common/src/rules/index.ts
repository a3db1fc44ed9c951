export { describeSignerDeeds, selfSignRefusal } from './signer-deeds.js';
