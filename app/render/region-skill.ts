/**
 * The numbers beside a difference map cropped to a region: the same weighted skill numbers as the skill rows
 * (app/stats), over the region's cells of the level on the screen, weighted by cell volume (area × water
 * thickness of the slice).
 */
import { pairMoments } from '../stats/moments.js';
import { skillFromMoments, type SkillNumbers } from '../stats/skill.js';

export function regionSkill(model: Float32Array, reference: Float32Array, area: Float64Array, thickness: Float32Array, cells: Int32Array): SkillNumbers {
  const weight = new Float64Array(model.length);
  for (let c = 0; c < weight.length; c++) weight[c] = area[c] * thickness[c];
  return skillFromMoments(pairMoments(model, reference, weight, cells));
}
