// Jest on Node 20 cannot `require` an ES module. @nestjs/throttler 6 is CommonJS and requires the ESM-only
// @nestjs/common 12 (Node 20.19 itself can, so the app is unaffected). The app uses only its storage
// service and storage token, which take nothing from @nestjs/common but `Injectable`: under jest, that one
// require is answered by a CommonJS stand-in, so the package's real storage code runs in the tests.
const { join } = require('node:path');

module.exports = (request, options) => {
  if (request === '@nestjs/common' && options.basedir.includes(join('node_modules', '@nestjs', 'throttler'))) {
    return join(__dirname, 'nestjs-common-injectable.cjs');
  }
  return options.defaultResolver(request, options);
};
