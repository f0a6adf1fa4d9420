/**
 * The quasar-physics columns of every export, in order (spread into the
 * catalogue's one column list, src/core/table/columns.ts). Logarithms use the
 * VOUnit bracket notation ('log(erg/s)': decimal log of a quantity in erg/s).
 */
const LINES = [
  ['civ', 'C IV'],
  ['mgii', 'Mg II'],
  ['hbeta', 'H-beta'],
  ['halpha', 'H-alpha'],
] as const;

const SYS = 'single-epoch masses carry about 0.4 dex systematic uncertainty (log_mbh_sys_dex)';

export const PHYSICS_COLUMN_DEFS = [
  { name: 'qso_phys_z', unit: '', type: 'float', decimals: 6, group: 'physics', ucd: 'src.redshift', description: 'Redshift the quasar quantities were measured at; empty when none were' },
  { name: 'qso_phys_note', unit: '', type: 'text', group: 'physics', ucd: 'meta.note', description: 'Why quasar quantities are missing (e.g. flux not calibrated, line not covered); empty when all were measured' },
  { name: 'qso_phys_draws', unit: '', type: 'int', group: 'physics', ucd: 'meta.number', description: 'Resampled spectra behind the quasar errors: 0 when they come from the fits\' covariances alone (the batch), more when a reviewer asked for errors by resampling' },
  ...([1350, 3000, 5100] as const).flatMap((a) => [
    { name: `loglam${a}`, unit: 'log(erg/s)', type: 'float', decimals: 3, group: 'physics', ucd: 'phys.luminosity', description: `log10 lambda L_lambda of the power-law continuum at ${a} A rest, erg/s; not corrected for extinction or host light` },
    { name: `loglam${a}_err`, unit: 'log(erg/s)', type: 'float', decimals: 3, group: 'physics', ucd: 'stat.error;phys.luminosity', description: `1-sigma statistical error of loglam${a}, dex (fit or resampling, the larger; flux calibration not included)` },
  ] as const),
  ...LINES.flatMap(([id, label]) => [
    { name: `fwhm_${id}_kms`, unit: 'km/s', type: 'float', decimals: 0, group: 'physics', ucd: 'spect.line.width', description: `FWHM of the broad ${label} profile (one or two Gaussians), not corrected for the instrument` },
    { name: `fwhm_${id}_err_kms`, unit: 'km/s', type: 'float', decimals: 0, group: 'physics', ucd: 'stat.error;spect.line.width', description: `1-sigma error of fwhm_${id}_kms: the larger of the fit's and the resampling draws'` },
    { name: `sigma_${id}_kms`, unit: 'km/s', type: 'float', decimals: 0, group: 'physics', ucd: 'phys.veloc.dispersion', description: `Line dispersion (second moment) of the broad ${label} profile` },
    { name: `sigma_${id}_err_kms`, unit: 'km/s', type: 'float', decimals: 0, group: 'physics', ucd: 'stat.error;phys.veloc.dispersion', description: `1-sigma error of sigma_${id}_kms` },
  ] as const),
  ...(
    [
      ['hbeta_vp06', 'H-beta, Vestergaard & Peterson 2006 (ApJ 641, 689)'],
      ['mgii_vo09', 'Mg II, Vestergaard & Osmer 2009 (ApJ 699, 800)'],
      ['mgii_s11', 'Mg II, Shen et al. 2011 (ApJS 194, 45)'],
      ['civ_vp06', 'C IV, Vestergaard & Peterson 2006 (ApJ 641, 689)'],
    ] as const
  ).flatMap(([id, src]) => [
    { name: `log_mbh_${id}`, unit: 'log(solMass)', type: 'float', decimals: 2, group: 'physics', ucd: 'phys.mass', description: `log10 single-epoch black-hole mass from ${src}; ${SYS}` },
    { name: `log_mbh_${id}_err`, unit: 'log(solMass)', type: 'float', decimals: 2, group: 'physics', ucd: 'stat.error;phys.mass', description: `Statistical error of log_mbh_${id}, dex (FWHM and luminosity only; the systematic is separate)` },
  ] as const),
  { name: 'log_mbh', unit: 'log(solMass)', type: 'float', decimals: 2, group: 'physics', ucd: 'phys.mass;meta.main', description: `Preferred log10 black-hole mass (rule of Shen et al. 2011: H-beta below z 0.7, Mg II S11 to 1.9, C IV above; else the first available); ${SYS}` },
  { name: 'log_mbh_err', unit: 'log(solMass)', type: 'float', decimals: 2, group: 'physics', ucd: 'stat.error;phys.mass', description: 'Statistical error of log_mbh, dex' },
  { name: 'log_mbh_sys_dex', unit: 'log(solMass)', type: 'float', decimals: 2, group: 'physics', ucd: 'stat.error.sys;phys.mass', description: 'Systematic uncertainty of every single-epoch mass, dex (about 0.4; common practice, e.g. Vestergaard & Peterson 2006; Shen 2013)' },
  { name: 'log_mbh_from', unit: '', type: 'text', group: 'physics', ucd: 'meta.code', description: 'Which estimate log_mbh is: hbeta_vp06, mgii_s11, mgii_vo09 or civ_vp06' },
  { name: 'log_lbol', unit: 'log(erg/s)', type: 'float', decimals: 3, group: 'physics', ucd: 'phys.luminosity', description: 'log10 bolometric luminosity: bolometric correction (Richards et al. 2006 SED as used by Shen et al. 2011: 3.81, 5.15, 9.26 at 1350, 3000, 5100 A) times the luminosity of the preferred mass' },
  { name: 'log_lbol_err', unit: 'log(erg/s)', type: 'float', decimals: 3, group: 'physics', ucd: 'stat.error;phys.luminosity', description: 'Statistical error of log_lbol, dex' },
  { name: 'log_edd_ratio', unit: '', type: 'float', decimals: 3, group: 'physics', ucd: 'arith.ratio', description: 'log10 L_bol / L_Edd with L_Edd = 1.26e38 (M / M_sun) erg/s and the preferred mass (inherits its 0.4 dex systematic)' },
  { name: 'log_edd_ratio_err', unit: '', type: 'float', decimals: 3, group: 'physics', ucd: 'stat.error;arith.ratio', description: 'Statistical error of log_edd_ratio, dex' },
  { name: 'bi_civ_kms', unit: 'km/s', type: 'float', decimals: 0, group: 'physics', ucd: 'spect.line.eqWidth', description: 'Balnicity index of C IV (Weymann et al. 1991, ApJ 373, 23) on a power-law continuum' },
  { name: 'bi_civ_err_kms', unit: 'km/s', type: 'float', decimals: 0, group: 'physics', ucd: 'stat.error;spect.line.eqWidth', description: 'Scatter of bi_civ_kms over the resampling draws' },
  { name: 'ai_civ_kms', unit: 'km/s', type: 'float', decimals: 0, group: 'physics', ucd: 'spect.line.eqWidth', description: 'Absorption index of C IV (Trump et al. 2006, ApJS 165, 1): troughs >= 1,000 km/s wide within 0-29,000 km/s' },
  { name: 'ai_civ_err_kms', unit: 'km/s', type: 'float', decimals: 0, group: 'physics', ucd: 'stat.error;spect.line.eqWidth', description: 'Scatter of ai_civ_kms over the resampling draws' },
  { name: 'n_civ_troughs', unit: '', type: 'int', group: 'physics', ucd: 'meta.number', description: 'Absorption troughs blueward of C IV (those counted by ai_civ_kms)' },
] as const;
