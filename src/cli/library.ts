/**
 * The library functions the CLI calls, bound in one place (so the commands stay thin and the
 * binding is easy to audit).
 */
import { checkCertificate, checkPaths, type CheckReport } from '../checker/index.js';
import { compileAnyMap } from '../flow/compile.js';
import { describeMap, parseMapSource, parseParamOverride, resolveMap } from '../model/index.js';
import { proveOrbit, type OrbitVerdict } from '../prove/index.js';
import { findCandidates, type Candidate } from '../search/index.js';

export type CandidateLike = Candidate;
export type ProveVerdictLike = OrbitVerdict;
export type CheckReportLike = CheckReport;

/** `compileMap` here compiles formula maps and flow maps alike (src/flow). */
const modelModule = { resolveMap, parseMapSource, parseParamOverride, compileMap: compileAnyMap, describeMap };
const searchModule = { findCandidates };
const proveModule = { proveOrbit };
const checkerModule = { checkCertificate, checkPaths };

export const model = async () => modelModule;
export const search = async () => searchModule;
export const prove = async () => proveModule;
export const checker = async () => checkerModule;
