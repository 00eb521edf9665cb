export { writeSkillTables, skillTableFiles, TABLE_FILES } from './write.js';
export { skillCsv } from './csv.js';
export { skillJson } from './json.js';
export { skillMarkdown } from './markdown.js';
export { skillLatex, texEscape, texUnits } from './latex.js';
export { consoleTable } from './console-table.js';
export type { Provenance } from './types.js';
