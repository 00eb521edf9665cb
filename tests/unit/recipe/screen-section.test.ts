// The recipe's `screen` section (the workbench's view saved with a session): what it accepts and refuses, and that
// it goes through validation and back to JSON unchanged.
import { describe, expect, it } from 'vitest';
import { screenSectionSchema } from '../../../app/recipe/screen-schema.js';

describe('screen section of a recipe', () => {
  it('accepts a saved view and keeps every key', () => {
    const screen = { view: 'line', variable: 'PO4', layer: 'k:3', projection: 'north-polar', fieldRange: [0, 2], logColour: true, mapWindow: { xmin: -1, xmax: 1, ymin: -1, ymax: 1 }, line: { points: [[-30, -60], [-30, 0]], spacingKm: 50, field: 2, stretch: true } };
    expect(screenSectionSchema.parse(screen)).toEqual(screen);
  });
  it('accepts a line without a field (the Line view shows every field) and one saved with it before', () => {
    const line = { points: [[-30, -60], [-30, 0]], spacingKm: 50, stretch: false };
    expect(screenSectionSchema.parse({ line })).toEqual({ line });
    expect(screenSectionSchema.safeParse({ line: { ...line, field: 1 } }).success).toBe(true);
  });
  it('refuses a colour range whose maximum is not above its minimum, naming the key', () => {
    const r = screenSectionSchema.safeParse({ fieldRange: [5, 1] });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].path).toEqual(['fieldRange']);
  });
  it('refuses unknown keys and waypoints beyond the poles', () => {
    expect(screenSectionSchema.safeParse({ colour: 'red' }).success).toBe(false);
    expect(screenSectionSchema.safeParse({ line: { points: [[0, 95], [0, 0]], spacingKm: 50, field: 0, stretch: false } }).success).toBe(false);
  });
});
