// Preloaded into a server process by tests/server/process-failures.spec.ts: on SIGUSR2 the process meets
// the failure named in FAIL_ON_SIGNAL, as a bug in some background work would make it.
process.on('SIGUSR2', () => {
  if (process.env.FAIL_ON_SIGNAL === 'throw') {
    throw new Error('a reminder tick threw');
  } else {
    void Promise.reject(new Error('a reminder tick was lost'));
  }
});
