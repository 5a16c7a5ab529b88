/**
 * The fields of a JSON report entry that the notebook format names since its first version (notebook-format.md,
 * "The JSON report"): each present in every entry, `null` when unknown, never missing.
 */
export const CONTRACT_FIELDS = [
  'file',
  'line',
  'id',
  'status',
  'beta',
  'temperature',
  'polarization',
  'thermalPolarization',
  'enhancement',
  'entropy',
  'diagnostics',
] as const;
