import { Component } from '@angular/core';
import { HttpClient, HttpErrorResponse, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { AuthService } from '../auth/auth-service';
import { unauthorizedInterceptor } from './unauthorized-interceptor';

@Component({ template: '' })
class Page {}

describe('unauthorizedInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let router: Router;
  let forgetUser: jasmine.Spy;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'sign-in', component: Page },
          { path: 'accounts', component: Page },
        ]),
        provideHttpClient(withInterceptors([unauthorizedInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    forgetUser = spyOn(TestBed.inject(AuthService), 'forgetUser').and.callThrough();
    await router.navigateByUrl('/accounts?page=2');
  });

  afterEach(() => backend.verify());

  async function answer(url: string, status: number): Promise<HttpErrorResponse> {
    const result = firstValueFrom(http.get(url)).then(
      () => {
        throw new Error(`${url} should have failed`);
      },
      (error: HttpErrorResponse) => error,
    );
    backend.expectOne(url).flush({ status, title: 'Error', detail: 'Refused', errors: [] }, { status, statusText: 'Error' });
    const error = await result;
    // The redirect is a navigation of its own; let it settle.
    await new Promise((resolve) => setTimeout(resolve));
    return error;
  }

  it('should send the user to sign in with the address they were at', async () => {
    await answer('/api/users', 401);
    expect(router.url).toBe('/sign-in?returnUrl=%2Faccounts%3Fpage%3D2');
    expect(forgetUser).toHaveBeenCalled();
  });

  it('should keep the return address when a second request is refused after the first', async () => {
    const slow = firstValueFrom(http.get('/api/users?page=1')).catch((error: HttpErrorResponse) => error);
    await answer('/api/users', 401);
    backend
      .expectOne('/api/users?page=1')
      .flush({ status: 401, title: 'Unauthorized', detail: 'Sign in first.', errors: [] }, { status: 401, statusText: 'Unauthorized' });
    await slow;
    await new Promise((resolve) => setTimeout(resolve));
    expect(router.url).toBe('/sign-in?returnUrl=%2Faccounts%3Fpage%3D2');
  });

  it('should still hand the error to the caller', async () => {
    const error = await answer('/api/users', 401);
    expect(error.status).toBe(401);
  });

  it('should leave a refused sign-in to the sign-in page', async () => {
    await answer('/api/auth/sign-in', 401);
    expect(router.url).toBe('/accounts?page=2');
    expect(forgetUser).not.toHaveBeenCalled();
  });

  it('should leave the start-up session check alone', async () => {
    await answer('/api/auth/me', 401);
    expect(router.url).toBe('/accounts?page=2');
  });

  it('should not act on a 403, which means signed in without the right role', async () => {
    await answer('/api/users', 403);
    expect(router.url).toBe('/accounts?page=2');
    expect(forgetUser).not.toHaveBeenCalled();
  });
});
