import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { apiErrorMessage } from '../core/api-error-message';
import { BrandingApi, type Branding } from './branding-api';

/**
 * Print settings: the studio name and logo printed at the top of every PDF sheet, with a preview
 * of the logo as stored (scaled by the server).
 */
@Component({
  selector: 'tensile-print-settings',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule],
  templateUrl: './print-settings.html',
  styleUrl: './print-settings.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PrintSettings {
  private readonly api = inject(BrandingApi);

  protected readonly branding = signal<Branding | null>(null);
  protected readonly studioName = signal('');
  protected readonly busy = signal(false);
  protected readonly message = signal<string | null>(null);
  protected readonly error = signal<string | null>(null);

  constructor() {
    this.api.get().subscribe({
      next: (branding) => this.show(branding),
      error: (error: unknown) => this.error.set(apiErrorMessage(error)),
    });
  }

  protected logoUrl(branding: Branding): string {
    return this.api.logoUrl(branding.updatedAt);
  }

  protected saveName(): void {
    this.run(this.api.setStudioName(this.studioName()), 'Studio name saved.');
  }

  protected upload(input: HTMLInputElement): void {
    const file = input.files?.[0];
    input.value = '';
    if (file) this.run(this.api.uploadLogo(file), 'Logo uploaded.');
  }

  protected removeLogo(): void {
    this.busy.set(true);
    this.api.removeLogo().subscribe({
      next: () => {
        const current = this.branding();
        if (current) this.branding.set({ ...current, logo: null });
        this.done('Logo removed.');
      },
      error: (error: unknown) => this.fail(error),
    });
  }

  private run(request: ReturnType<BrandingApi['get']>, success: string): void {
    this.busy.set(true);
    this.message.set(null);
    this.error.set(null);
    request.subscribe({
      next: (branding) => {
        this.show(branding);
        this.done(success);
      },
      error: (error: unknown) => this.fail(error),
    });
  }

  private show(branding: Branding): void {
    this.branding.set(branding);
    this.studioName.set(branding.studioName);
  }

  private done(message: string): void {
    this.busy.set(false);
    this.message.set(message);
  }

  private fail(error: unknown): void {
    this.busy.set(false);
    this.error.set(apiErrorMessage(error));
  }
}
