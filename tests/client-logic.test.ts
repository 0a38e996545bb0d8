// The client's pure rules, without a browser: where sign-in may send you, how forms get their
// field messages, and how the function reference is searched and grouped.
import { describe, expect, it } from 'vitest';
import { signUpSchema } from '../shared/auth.js';
import { ApiError } from '../src/lib/api.js';
import { checkForm, errorsFromApi, sentence } from '../src/lib/fieldErrors.js';
import { safeNext } from '../src/features/auth/safeNext.js';
import { allFunctions, groupByFamily, searchFunctions } from '../src/features/reference/referenceData.js';
import { catalog } from '../functions/catalog/index.js';

describe('after sign-in', () => {
  it('returns to the page the guard interrupted', () => {
    expect(safeNext(new URLSearchParams('next=%2Fworkbooks%2Fab12%3Fsheet%3D2'))).toBe('/workbooks/ab12?sheet=2');
  });

  it('never follows `next` off the site (open redirect)', () => {
    for (const next of ['https://evil.example/', '//evil.example/x', '/\\evil.example', 'javascript:alert(1)']) {
      expect(safeNext(new URLSearchParams({ next }))).toBe('/');
    }
  });
});

describe('form messages', () => {
  it('puts the shared schema’s message beside each field, as a sentence', () => {
    const checked = checkForm(signUpSchema, { name: 'Ada', email: 'ada-at-lab', password: 'short' });
    expect(checked).toEqual({ errors: { fields: { email: 'Not a valid email address.', password: 'At least 10 characters.' }, form: undefined } });
  });

  it('maps a 400 from the API to the fields it names', () => {
    const error = new ApiError(400, 'invalid_input', 'title: required', { issues: [{ field: 'title', message: 'required' }] });
    expect(errorsFromApi(error, ['title'])).toEqual({ fields: { title: 'Required.' }, form: undefined });
  });

  it('shows a refusal that names no field (wrong password, rate limit) above the form', () => {
    const error = new ApiError(401, 'wrong_credentials', 'email or password is not correct');
    expect(errorsFromApi(error, ['email', 'password'])).toEqual({ fields: {}, form: 'Email or password is not correct.' });
  });

  it('says the server could not be reached when fetch itself failed', () => {
    expect(errorsFromApi(new TypeError('Failed to fetch'), ['email']).form).toMatch(/could not reach the server/i);
  });

  it('keeps a message that already ends a sentence', () => {
    expect(sentence('try again in 5 minutes?')).toBe('Try again in 5 minutes?');
  });
});

describe('function reference', () => {
  const help = allFunctions;

  it('lists every catalog function exactly once, grouped by family', () => {
    const groups = groupByFamily(help);
    const grouped = groups.flatMap((g) => g.functions.map((f) => f.name));
    expect(grouped.sort()).toEqual(catalog.map((e) => e.name).sort());
    for (const g of groups) expect(g.functions.every((f) => f.family === g.family)).toBe(true);
    expect(new Set(groups.map((g) => g.family)).size).toBe(groups.length);
  });

  it('finds a function by a word of its name and needs every word of the query to match', () => {
    expect(searchFunctions(help, 'overlap1s').map((f) => f.name)).toContain('OVERLAP1S');
    expect(searchFunctions(help, 'overlap zzzz-no-such-word')).toEqual([]);
    expect(searchFunctions(help, '   ')).toHaveLength(help.length);
  });
});
