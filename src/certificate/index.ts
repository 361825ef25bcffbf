export * from './types.js';
export { canonicalJson, certificateHash, hasValidHash } from './canonical.js';
export {
  buildCertificate,
  certificateMap,
  effectiveParams,
  paramToCertificate,
  CertificateBuildError,
  type BuildCertificateOptions,
  type ProvenOrbitData,
} from './build.js';
export {
  writeCertificate,
  writeFileAtomic,
  DirectorySync,
  serializeCertificate,
  certificateFileName,
  mapSlug,
  CertificateWriteError,
  type CertificateWriteErrorCode,
  type WriteOptions,
} from './write.js';
export { packageVersion, PRODUCER_NAME } from './producer.js';
