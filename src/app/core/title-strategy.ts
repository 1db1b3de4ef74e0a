import { Injectable, inject } from '@angular/core';
import { Title } from '@angular/platform-browser';
import { RouterStateSnapshot, TitleStrategy } from '@angular/router';

/** Page titles read "Tensile · Rule cards": the product first, then the page, for every route. */
@Injectable({ providedIn: 'root' })
export class TensileTitleStrategy extends TitleStrategy {
  private readonly title = inject(Title);

  override updateTitle(snapshot: RouterStateSnapshot): void {
    const page = this.buildTitle(snapshot);
    this.title.setTitle(page ? `Tensile · ${page}` : 'Tensile');
  }
}
