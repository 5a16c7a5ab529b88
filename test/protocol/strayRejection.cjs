// Preloaded into the server process by test/protocol/settings.test.ts
// (`node --require`): once the server module has started, one promise is
// rejected with nobody to catch it, as a slip in the code would leave it.
// Node's default for that is exit 1; the server must log it and keep serving.
setImmediate(() => {
  void Promise.reject(new Error('a rejection nothing handles, left by test/protocol/strayRejection.cjs'));
});
