import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { Session } from '../auth/session';

/** Requests whose 401 answers are expected and handled by their callers. */
const OWN_401_URLS = ['/api/auth/me', '/api/auth/login'];

/**
 * When the server answers 401 (the session expired or was ended elsewhere), forget the user and
 * send them to sign in, coming back to the page they were on. The error still reaches the caller.
 */
export const unauthorizedInterceptor: HttpInterceptorFn = (request, next) => {
  const session = inject(Session);
  const router = inject(Router);
  return next(request).pipe(
    catchError((error: unknown) => {
      const handledByCaller = OWN_401_URLS.some((url) => request.url.startsWith(url));
      if (error instanceof HttpErrorResponse && error.status === 401 && !handledByCaller) {
        session.clear();
        const returnUrl = router.url;
        if (!returnUrl.startsWith('/sign-in')) {
          void router.navigate(['/sign-in'], { queryParams: { returnUrl } });
        }
      }
      return throwError(() => error);
    }),
  );
};
