import { HttpErrorResponse } from '@angular/common/http';
import { FormControl } from '@angular/forms';
import { describe, expect, it } from 'vitest';
import { applyProblemToControls, fieldMessages, problemMessage, toProblem } from './problem';

describe('problem helpers', () => {
  it('keeps a problem+json body as it came', () => {
    const body = { type: 'https://laminote.example/problems/validation', title: 'Invalid request', status: 400, field: 'title', detail: 'title must not be empty' };
    expect(toProblem(new HttpErrorResponse({ status: 400, error: body }))).toEqual(body);
  });

  it('says the server could not be reached when there is no response at all', () => {
    expect(toProblem(new HttpErrorResponse({ status: 0, error: new ProgressEvent('error') })).title).toBe(
      'The Laminote server could not be reached',
    );
  });

  it('falls back to the status text for a body that is not a problem', () => {
    const problem = toProblem(new HttpErrorResponse({ status: 502, statusText: 'Bad Gateway', error: '<html>proxy</html>' }));
    expect(problem).toMatchObject({ status: 502, title: 'Bad Gateway' });
  });

  it('reads field messages from errors[] and from field with detail', () => {
    const messages = fieldMessages({
      type: 'about:blank',
      title: 'Invalid request',
      status: 400,
      field: 'name',
      detail: 'name must not be empty',
      errors: [{ field: 'leadEmail', message: 'leadEmail must be an e-mail address' }],
    });
    expect([...messages]).toEqual([
      ['leadEmail', 'leadEmail must be an e-mail address'],
      ['name', 'name must not be empty'],
    ]);
  });

  it('puts messages on the named controls and hands back the rest', () => {
    const title = new FormControl('x');
    const unplaced = applyProblemToControls(
      {
        type: 'about:blank',
        title: 'Invalid request',
        status: 400,
        errors: [
          { field: 'title', message: 'title is taken' },
          { field: 'cells[2].inputs.reynolds', message: 'must be positive' },
        ],
      },
      { title },
    );
    expect(title.getError('server')).toBe('title is taken');
    expect(title.touched).toBe(true);
    expect(unplaced).toEqual(['cells[2].inputs.reynolds: must be positive']);
  });

  it('hands back the whole message when no field is named', () => {
    const unplaced = applyProblemToControls({ type: 'about:blank', title: 'Conflict', status: 409, detail: 'changed by someone else' }, {});
    expect(unplaced).toEqual([problemMessage({ type: 'about:blank', title: 'Conflict', status: 409, detail: 'changed by someone else' })]);
  });
});
