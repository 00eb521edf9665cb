export { writeSkillTables, skillTableFiles, TABLE_FILES } from './write.js';
export { skillCsv } from './skill-csv.js';
export { skillJson } from './skill-json.js';
export { skillMarkdown } from './markdown.js';
export { skillLatex, texEscape, texUnits } from './latex.js';
export { consoleTable } from './console-table.js';
export type { Provenance } from './types.js';
