import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';

export interface Branding {
  readonly studioName: string;
  readonly logo: { readonly mime: string; readonly width: number; readonly height: number } | null;
  readonly updatedAt: string | null;
}

/** The teacher's print branding: studio name and logo for PDF headers. */
@Injectable({ providedIn: 'root' })
export class BrandingApi {
  private readonly http = inject(HttpClient);

  get(): Observable<Branding> {
    return this.http.get<{ branding: Branding }>('/api/branding').pipe(map((b) => b.branding));
  }

  setStudioName(studioName: string): Observable<Branding> {
    return this.http
      .put<{ branding: Branding }>('/api/branding', { studioName })
      .pipe(map((b) => b.branding));
  }

  uploadLogo(file: File): Observable<Branding> {
    const form = new FormData();
    form.append('logo', file, file.name);
    return this.http
      .put<{ branding: Branding }>('/api/branding/logo', form)
      .pipe(map((b) => b.branding));
  }

  removeLogo(): Observable<void> {
    return this.http.delete<void>('/api/branding/logo');
  }

  /** The stored logo's address; `version` changes with every upload so the preview refreshes. */
  logoUrl(version: string | null): string {
    return `/api/branding/logo?v=${encodeURIComponent(version ?? '')}`;
  }
}
