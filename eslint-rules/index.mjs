// Kilocycle's local ESLint rules, loaded by eslint.config.mjs as the plugin `kilocycle`.
import tableOwner from './table-owner.mjs';

export default {
  meta: { name: 'eslint-plugin-kilocycle' },
  rules: { 'table-owner': tableOwner },
};
