import { ChangeDetectionStrategy, Component, computed, input, model, output } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { seedErrorState } from './seed-problem';

/**
 * The drill page's seed field with Regenerate and New seed. The page loads it once idle, so the
 * form field and the forms module stay off the score's path.
 */
@Component({
  selector: 'tensile-seed-form',
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  templateUrl: './seed-form.html',
  styleUrl: './seed-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SeedForm {
  readonly draft = model.required<string>();
  /** What is wrong with the draft, in words, or null. */
  readonly problem = input<string | null>(null);
  readonly regenerate = output();
  readonly newSeed = output();

  protected readonly errors = seedErrorState(computed(() => this.problem()));
}
