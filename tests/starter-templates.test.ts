// The empty-workbook state: starter templates whose every formula computes, offered only while the
// whole workbook is empty and the user may edit, and typed in as ordinary edits.
import { allowedActions } from '../shared/permissions.js';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { createEngine } from '../functions/engine.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { StarterTemplate } from '../src/features/grid/StarterTemplate.js';
import { starterTemplates, templateChanges } from '../src/features/grid/starterTemplates.js';

const payload = (role: WorkbookPayload['role'], cells: [number, number, string][] = []): WorkbookPayload => ({
  id: 'wb',
  title: 'New workbook',
  revision: 0,
  role,
  actions: allowedActions([role]),
  sheets: [{ id: 'sheet-1', name: 'Sheet1', position: 0, settings: {}, cells }],
});

describe('starter templates', () => {
  for (const template of starterTemplates) {
    it(`computes every formula of the "${template.label}" template without an error`, () => {
      const engine = createEngine({ Sheet1: template.rows });
      let formulas = 0;
      template.rows.forEach((cells, row) =>
        cells.forEach((input, col) => {
          if (!input.startsWith('=')) return;
          formulas++;
          const value = engine.getCellValue({ sheet: 0, row, col });
          expect(value, `${input} → ${JSON.stringify(value)}`).not.toBeNull();
          expect(typeof value === 'object', `${input} → ${JSON.stringify(value)}`).toBe(false);
        }),
      );
      engine.destroy();
      expect(formulas).toBeGreaterThanOrEqual(20);
    });
  }

  it('starts at A1 with a title row over the species or molecule rows', () => {
    const changes = templateChanges(starterTemplates[0], 'sheet-1');
    expect(changes[0]).toEqual({ sheetId: 'sheet-1', row: 0, col: 0, input: 'Species' });
    expect(changes.find((c) => c.row === 1 && c.col === 2)?.input).toBe('=BONDORDER(A2)');
  });

  it('fills in dioxygen\'s bond order 2 and two unpaired electrons when applied to an empty workbook', () => {
    const sent: unknown[] = [];
    const model = new WorkbookModel(payload('owner'), { onLocalChanges: (changes) => sent.push(...changes) });
    const outcome = model.edit(templateChanges(starterTemplates[0], 'sheet-1'));
    expect(outcome.refused).toEqual([]);
    expect(model.view('sheet-1', 1, 2)?.value).toBe(2); // BONDORDER("O2")
    expect(model.view('sheet-1', 1, 3)?.value).toBe(2); // UNPAIRED("O2")
    expect(sent).toHaveLength(starterTemplates[0].rows.flat().length); // saved like any typing
    model.dispose();
  });
});

describe('the empty-state bar', () => {
  const render = (model: WorkbookModel) => renderToStaticMarkup(createElement(StarterTemplate, { model, sheetId: 'sheet-1' }));

  it('offers each template, and starting blank, in an empty workbook someone may edit', () => {
    const model = new WorkbookModel(payload('editor'));
    const html = render(model);
    for (const t of starterTemplates) expect(html).toContain(t.label);
    expect(html).toContain('Start blank');
    model.dispose();
  });

  it('stays away once any cell holds something, and from viewers', () => {
    const filled = new WorkbookModel(payload('owner', [[0, 0, 'O2']]));
    expect(render(filled)).toBe('');
    filled.dispose();
    const viewer = new WorkbookModel(payload('viewer'));
    expect(render(viewer)).toBe('');
    viewer.dispose();
  });
});
