export { describeSignerDeeds, selfSignRefusal } from './signer-deeds.js';
export { passwordShapeProblem, utf8Length } from './password.js';
