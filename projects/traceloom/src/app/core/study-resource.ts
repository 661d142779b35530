import { httpResource, type HttpResourceRef } from '@angular/common/http';
import type { StudyDto } from '@traceloom/shared/api';

/**
 * The study `id()` as a resource (call in an injection context): idle while there is no id, a
 * new id cancels the previous request. Here, not in a feature's api, because pieces that
 * features below `studies` use (the breadcrumb, datasets) read it too.
 */
export function studyResource(
  id: () => string | null | undefined,
): HttpResourceRef<StudyDto | undefined> {
  return httpResource<StudyDto>(() => {
    const studyId = id();
    return studyId ? `/api/studies/${encodeURIComponent(studyId)}` : undefined;
  });
}
