/**
 * The only import surface of the numerical core. Pure TypeScript (ES2022), no DOM and no
 * Node APIs: runs unchanged in Node (tests, CLI) and in a Web Worker.
 */
export * from './types';
export { solveProblem, EPSILON_0, MAX_NODES } from './solve-problem';
export { MESH_PRESET_PARAMS, FAMILY_LEVELS } from './mesh';
export type { MeshParams } from './mesh';
export { richardson } from './extrapolate';
export type { Extrapolated } from './extrapolate';
export { applyOperator } from './operator';
export { setupHierarchy, solve } from './multigrid';
export type { Hierarchy, HierarchyOptions } from './multigrid';
export { insideGeometry } from './geometry';
