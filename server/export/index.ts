// Export bundle: the Server and the CLI use only these.
export { buildBundle, renderBundleFiles, MANIFEST_FORMAT, type Bundle, type BundleInput } from './bundle';
export { renderCoefficientHeader, renderHeader } from './render';
export { designSlug } from './slug';
export { cNames } from './cIdentifiers';
export { canonicalJson, sha256Hex } from './canonical';
export { SAFETY_CAUTION, type ExportMeta } from './presenter';
