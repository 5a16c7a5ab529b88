// Preloaded (`node -r`) into a benchmarked process: at exit, writes the CPU time the whole process used (every
// thread, user + system, microseconds) to standard error as one line `cpu-us <n>`.
process.on('exit', () => {
  const u = process.cpuUsage();
  process.stderr.write(`cpu-us ${u.user + u.system}\n`);
});
