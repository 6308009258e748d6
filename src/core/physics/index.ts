/** The mechanical drive model: technology profile, capstan budgets, buffer trees, drum, operator force, bill of materials. */
export * from './profile.js';
export * from './profile-load.js';
export * from './capstan.js';
export * from './drive.js';
export * from './buffer-tree.js';
export * from './drum.js';
export * from './operator.js';
export * from './bom.js';
export * from './check-drive.js';
export * from './routing.js';
export * from './actuators.js';
export * from './headroom.js';
