import { Injectable, inject } from '@angular/core';
import { ComponentType } from '@angular/cdk/portal';
import {
  MatSnackBar,
  MatSnackBarConfig,
  MatSnackBarRef,
  TextOnlySnackBar,
} from '@angular/material/snack-bar';
import { NavigationStart, Router } from '@angular/router';

/**
 * How long before a navigation a toast must have opened to count as the old page's. A toast
 * opened by the action that navigates ("Draft deleted." and then the list) opens a moment before
 * the navigation starts and goes along; one opened earlier belongs to the page being left.
 */
export const CARRY_OVER_MS = 400;

/**
 * The app's snackbar: the Material one, except that a toast does not carry over onto the next
 * page. Provided in place of `MatSnackBar`, so every `inject(MatSnackBar)` gets it.
 */
@Injectable()
export class PageToasts extends MatSnackBar {
  private openedAt = 0;

  constructor() {
    super();
    inject(Router).events.subscribe((event) => {
      if (!(event instanceof NavigationStart)) return;
      if (this._openedSnackBarRef && Date.now() - this.openedAt >= CARRY_OVER_MS) this.dismiss();
    });
  }

  override open(
    message: string,
    action?: string,
    config?: MatSnackBarConfig,
  ): MatSnackBarRef<TextOnlySnackBar> {
    this.openedAt = Date.now();
    return super.open(message, action, config);
  }

  override openFromComponent<T, D = unknown>(
    component: ComponentType<T>,
    config?: MatSnackBarConfig<D>,
  ): MatSnackBarRef<T> {
    this.openedAt = Date.now();
    return super.openFromComponent(component, config);
  }
}
