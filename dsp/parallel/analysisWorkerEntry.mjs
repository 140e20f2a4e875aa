// Worker entry in plain JavaScript: loads the TypeScript worker directly when a
// TypeScript loader is already active (tsx), else registers tsx's loader first.
try {
  await import('./analysisWorker.ts');
} catch (error) {
  if (error?.code !== 'ERR_UNKNOWN_FILE_EXTENSION') throw error;
  const { register } = await import('tsx/esm/api');
  register();
  // A new specifier: the failed import above stays cached under the old one.
  await import('./analysisWorker.ts?with-loader');
}
