import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

export type NotFoundSubject = 'project' | 'study' | 'page';

/**
 * What a missing or unshared project, study or address shows. The server answers 404 both for what does
 * not exist and for what is not shared with the caller, so the page says both, calmly.
 */
@Component({
  selector: 'lam-not-found',
  imports: [MatButtonModule, MatIconModule, RouterLink],
  templateUrl: './not-found.html',
  styleUrl: './not-found.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotFound {
  /** Also bound from route data; a route that gives none leaves it undefined, which reads as `page`. */
  readonly subject = input<NotFoundSubject | undefined>('page');
  private readonly subjectOrPage = computed(() => this.subject() ?? 'page');

  protected readonly heading = computed(() => {
    switch (this.subjectOrPage()) {
      case 'project':
        return 'Project not found or not shared with you';
      case 'study':
        return 'Study not found or not shared with you';
      case 'page':
        return 'Page not found';
    }
  });

  protected readonly explanation = computed(() =>
    this.subjectOrPage() === 'page'
      ? 'There is nothing at this address.'
      : `It may have been removed, or you are not a member of its project. The project's lead can add you.`,
  );
}
