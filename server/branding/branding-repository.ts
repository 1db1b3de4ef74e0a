import type { Knex } from 'knex';
import { isoTime } from '../rows';
import type { LogoImage, LogoMime } from './logo-image';

interface BrandingRow {
  user_id: number;
  studio_name: string;
  logo: Buffer | null;
  logo_mime: string | null;
  logo_width: number | null;
  logo_height: number | null;
  updated_at: Date | number | string;
}

/** A teacher's branding as stored (the logo's bytes only where asked for). */
export interface StoredBranding {
  readonly studioName: string;
  readonly logo: Omit<LogoImage, 'bytes'> | null;
  readonly updatedAt: string;
}

/** One row per teacher who has set a studio name or a logo. */
export class BrandingRepository {
  constructor(private readonly db: Knex) {}

  async find(userId: number): Promise<StoredBranding | undefined> {
    const row = await this.db<BrandingRow>('branding')
      .select('studio_name', 'logo_mime', 'logo_width', 'logo_height', 'updated_at')
      .where({ user_id: userId })
      .first();
    return row && toBranding(row);
  }

  async findLogo(userId: number): Promise<LogoImage | undefined> {
    const row = await this.db<BrandingRow>('branding')
      .select('logo', 'logo_mime', 'logo_width', 'logo_height')
      .where({ user_id: userId })
      .whereNotNull('logo')
      .first();
    if (!row?.logo) return undefined;
    return {
      bytes: Buffer.from(row.logo),
      mime: row.logo_mime as LogoMime,
      width: row.logo_width ?? 0,
      height: row.logo_height ?? 0,
    };
  }

  async saveName(userId: number, studioName: string): Promise<void> {
    await this.upsert(userId, { studio_name: studioName });
  }

  async saveLogo(userId: number, logo: LogoImage | null): Promise<void> {
    await this.upsert(userId, {
      logo: logo?.bytes ?? null,
      logo_mime: logo?.mime ?? null,
      logo_width: logo?.width ?? null,
      logo_height: logo?.height ?? null,
    });
  }

  private async upsert(userId: number, changes: Partial<BrandingRow>): Promise<void> {
    await this.db('branding')
      .insert({ user_id: userId, studio_name: '', ...changes, updated_at: new Date() })
      .onConflict('user_id')
      .merge({ ...changes, updated_at: new Date() });
  }
}

function toBranding(row: Partial<BrandingRow>): StoredBranding {
  return {
    studioName: row.studio_name ?? '',
    logo: row.logo_mime
      ? {
          mime: row.logo_mime as LogoMime,
          width: row.logo_width ?? 0,
          height: row.logo_height ?? 0,
        }
      : null,
    updatedAt: isoTime(row.updated_at!),
  };
}
