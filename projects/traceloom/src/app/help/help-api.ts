import { HttpClient, httpResource, type HttpResourceRef } from '@angular/common/http';
import { Injectable, inject, type ResourceRef } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { catchError, forkJoin, map, of } from 'rxjs';
import { ApiError } from '../core/api-error';
import { HELP_PAGES, HelpPage, isHtmlFallback } from './help-pages';

/** The user guide's Markdown files (static files under /docs, not the API). */
@Injectable({ providedIn: 'root' })
export class HelpApi {
  private readonly http = inject(HttpClient);

  /**
   * The guide pages whose file was shipped, in reading order, one per title, as a resource (call
   * in an injection context). One answer from one request per candidate page, so an rxResource;
   * it fails with a sentence when no page was shipped at all.
   */
  pagesResource(): ResourceRef<HelpPage[] | undefined> {
    return rxResource({
      stream: () =>
        forkJoin(
          HELP_PAGES.map((p) =>
            this.http.get(`/docs/${p.slug}.md`, { responseType: 'text' }).pipe(
              map((body) => (isHtmlFallback(body) ? null : p)),
              catchError(() => of(null)),
            ),
          ),
        ).pipe(
          map((found) => {
            const seen = new Set<string>();
            const pages = found.filter((p): p is HelpPage => {
              if (!p || seen.has(p.title)) return false;
              seen.add(p.title);
              return true;
            });
            if (pages.length === 0) {
              throw new ApiError(404, 'no_guide', 'No guide pages were shipped with this build.');
            }
            return pages;
          }),
        ),
    });
  }

  /**
   * The Markdown of the guide page `slug()` (idle while undefined) as a resource; a new page
   * cancels the previous request. The server answers a missing file with the app's own page:
   * that is a 404 here.
   */
  pageResource(slug: () => string | undefined): HttpResourceRef<string | undefined> {
    return httpResource.text(
      () => {
        const page = slug();
        return page ? `/docs/${encodeURIComponent(page)}.md` : undefined;
      },
      {
        parse: (body: string) => {
          if (isHtmlFallback(body)) {
            throw new ApiError(404, 'not_found', 'This guide page does not exist.');
          }
          return body;
        },
      },
    );
  }
}
