import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import type { ProductFormDto, ProductTarget } from '@traceloom/shared/api';

export type { ProductFormDto, ProductTarget } from '@traceloom/shared/api';

/** Product forms on request for a finished run. */
@Injectable({ providedIn: 'root' })
export class ProductApi {
  private readonly http = inject(HttpClient);

  /** The product form of one row, weight or the grand function of run `runId`. */
  productForm(runId: string, target: ProductTarget): Observable<ProductFormDto> {
    const params: Record<string, string> = { of: target.of };
    if (target.of === 'row') params['N'] = String(target.N);
    if (target.of === 'weight') params['L'] = String(target.L);
    return this.http.get<ProductFormDto>(`/api/runs/${encodeURIComponent(runId)}/product-form`, {
      params,
    });
  }
}
