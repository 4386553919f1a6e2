/**
 * Small helpers for the tidy CSV outputs: RFC 4180 quoting and fixed-precision numbers with empty cells
 * for missing values.
 */

/**
 * One CSV field: quoted (with doubled quotes) when it holds a comma, quote, CR or LF (RFC 4180 sec. 2).
 *
 * @param value - text
 * @returns the field
 */
export function csvField(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/**
 * A number with a fixed count of decimals; empty for null, NaN or infinities.
 *
 * @param value - number or null
 * @param decimals - decimals kept
 * @returns the text (trailing zeros kept for a stable layout)
 */
export function csvNumber(value: number | null | undefined, decimals: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '';
  const t = value.toFixed(decimals);
  return t === `-${(0).toFixed(decimals)}` ? (0).toFixed(decimals) : t;
}

/**
 * A covariate value: numbers with up to 6 significant decimals, strings quoted as needed.
 *
 * @param value - covariate value
 * @returns the field
 */
export function csvCovariate(value: number | string | undefined): string {
  if (value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(Number(value.toPrecision(10))) : '';
  return csvField(value);
}

/**
 * The header comment line every output starts with.
 *
 * @param version - Forecatch version
 * @param settingsHash - stable settings hash
 * @returns `# forecatch <version> settings <hash>`
 */
export function outputHeaderLine(version: string, settingsHash: string): string {
  return `# forecatch ${version} settings ${settingsHash}`;
}
