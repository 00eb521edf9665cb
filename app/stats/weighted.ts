/** The statistics entry point named in the shared contracts: re-exports of moments and skill numbers. */
export { emptyMoments, mergeMoments, pairMoments, type PairMoments } from './moments.js';
export { skillFromMoments, skillStats, type SkillNumbers } from './skill.js';
export { log10Values } from './log-space.js';
export { multiTracerCost, type CostTerm } from './cost.js';
