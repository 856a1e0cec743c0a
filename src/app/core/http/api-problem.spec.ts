import { HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { problemFrom, retryAfterSeconds } from './api-problem';

describe('problemFrom', () => {
  it("should keep the API's problem with its field errors", () => {
    const body = { status: 400, title: 'Bad Request', detail: 'Check the fields.', errors: [{ path: 'newPassword', message: 'Password is too common' }] };
    expect(problemFrom(new HttpErrorResponse({ status: 400, error: body }))).toEqual(body);
  });

  it('should explain an unreachable server', () => {
    const problem = problemFrom(new HttpErrorResponse({ status: 0, error: new ProgressEvent('error') }));
    expect(problem.title).toBe('Server unreachable');
    expect(problem.errors).toEqual([]);
  });

  it('should describe an answer that is not a problem by its status', () => {
    const problem = problemFrom(new HttpErrorResponse({ status: 502, statusText: 'Bad Gateway', error: '<html>proxy</html>' }));
    expect(problem).toEqual(jasmine.objectContaining({ status: 502, detail: 'The server answered 502 Bad Gateway.' }));
  });
});

describe('retryAfterSeconds', () => {
  it('should read the seconds of the Retry-After header', () => {
    const error = new HttpErrorResponse({ status: 429, headers: new HttpHeaders({ 'Retry-After': '17' }) });
    expect(retryAfterSeconds(error)).toBe(17);
  });

  it('should give null without a usable header', () => {
    expect(retryAfterSeconds(new HttpErrorResponse({ status: 429 }))).toBeNull();
    const dated = new HttpErrorResponse({ status: 429, headers: new HttpHeaders({ 'Retry-After': 'Wed, 21 Oct 2026 07:28:00 GMT' }) });
    expect(retryAfterSeconds(dated)).toBeNull();
  });
});
