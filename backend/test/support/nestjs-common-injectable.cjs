// Under jest only (see jest-resolver.cjs): @nestjs/common's Injectable, as @nestjs/throttler's storage
// service requires it. It marks the class the way Nest does; Nest's injector does not need more of it here.
exports.Injectable = () => (target) => {
  Reflect.defineMetadata('__injectable__', true, target);
};
