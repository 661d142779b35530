import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import { DirectoryEntryDto, StudyDto } from '@traceloom/shared/api';

/** The study endpoints (writes; reads go through httpResource in the components). */
@Injectable({ providedIn: 'root' })
export class StudiesApi {
  private readonly http = inject(HttpClient);

  /** Creates a study owned by the caller. */
  create(body: { title: string; description?: string }): Observable<StudyDto> {
    return this.http.post<StudyDto>('/api/studies', body);
  }

  /** Renames and/or re-describes a study. */
  update(id: string, body: { title?: string; description?: string }): Observable<StudyDto> {
    return this.http.patch<StudyDto>(`/api/studies/${encodeURIComponent(id)}`, body);
  }

  /** Deletes a study (owner or admin). */
  remove(id: string): Observable<void> {
    return this.http.delete<void>(`/api/studies/${encodeURIComponent(id)}`);
  }

  /** Adds a user as a member; answers the updated study. */
  addMember(id: string, userId: string): Observable<StudyDto> {
    return this.http.post<StudyDto>(`/api/studies/${encodeURIComponent(id)}/members`, { userId });
  }

  /** Removes a member; answers the updated study. */
  removeMember(id: string, userId: string): Observable<StudyDto> {
    return this.http.delete<StudyDto>(
      `/api/studies/${encodeURIComponent(id)}/members/${encodeURIComponent(userId)}`,
    );
  }

  /** Active users, for picking members. */
  directory(): Observable<DirectoryEntryDto[]> {
    return this.http.get<DirectoryEntryDto[]>('/api/users/directory');
  }
}
