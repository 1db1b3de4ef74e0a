import type { PrintLogo } from '../pdf/worksheet-print';
import { notFound } from '../http-error';
import type { BrandingRepository } from './branding-repository';
import { prepareLogo, type LogoImage } from './logo-image';

/** What the settings page shows: the name and, when there is one, the logo's kind and size. */
export interface Branding {
  readonly studioName: string;
  readonly logo: { readonly mime: string; readonly width: number; readonly height: number } | null;
  readonly updatedAt: string | null;
}

/** Studio name and logo per teacher, for the print header. */
export class BrandingService {
  constructor(private readonly repository: BrandingRepository) {}

  async get(userId: number): Promise<Branding> {
    const stored = await this.repository.find(userId);
    return stored ?? { studioName: '', logo: null, updatedAt: null };
  }

  async setStudioName(userId: number, studioName: string): Promise<Branding> {
    await this.repository.saveName(userId, studioName);
    return this.get(userId);
  }

  /** Checks and scales the upload first: a refused file leaves the stored logo as it was. */
  async setLogo(userId: number, upload: Buffer): Promise<Branding> {
    const logo = await prepareLogo(upload);
    await this.repository.saveLogo(userId, logo);
    return this.get(userId);
  }

  async removeLogo(userId: number): Promise<void> {
    await this.repository.saveLogo(userId, null);
  }

  async logo(userId: number): Promise<LogoImage> {
    const logo = await this.repository.findLogo(userId);
    if (!logo) throw notFound('You have not uploaded a logo.');
    return logo;
  }

  /**
   * The header of a printed sheet: the studio name (the teacher's own name until one is set)
   * and the logo, if any.
   */
  async forPrint(
    userId: number,
    teacherName: string,
  ): Promise<{ studioName: string; logo?: PrintLogo }> {
    const stored = await this.repository.find(userId);
    const logo = stored?.logo ? await this.repository.findLogo(userId) : undefined;
    return {
      studioName: stored?.studioName || teacherName,
      ...(logo ? { logo: { bytes: logo.bytes, mime: logo.mime } } : {}),
    };
  }
}
