import { ChangeDetectionStrategy, Component, input } from '@angular/core';

/** What the survey collects, who sees it, how long it is kept, and the participant's rights. */
@Component({
  selector: 'app-privacy-notice',
  template: `
    @if (short()) {
      <p>
        Your answers are seen only by {{ names() }}, who can delete them at any time. They are kept for this workshop only. Local privacy
        and employment rules, and any works council agreement, take precedence.
      </p>
    } @else {
      <h2>Before you answer</h2>
      <ul class="notice">
        <li><strong>What is collected:</strong> the names you pick from the list and how often you talk to each. Nothing else.</li>
        <li>
          <strong>Who sees it:</strong> only the workshop's facilitators ({{ names() }}). Other participants never see your answers; they
          later see only the room's overall results and their own.
        </li>
        <li>
          <strong>What it is for:</strong> a map of who talks to whom, used in the workshop to rehearse how news travels. It says where
          people sit in the map, not what anyone is worth, and must not be used to judge anyone's work.
        </li>
        <li>
          <strong>How long it is kept:</strong> for this workshop only. The facilitator can delete your answers, or the whole room and
          everything in it, at any time; ask them to.
        </li>
        <li>
          <strong>Your choice:</strong> answering is voluntary. Local privacy and employment rules, and any works council agreement where
          you work, take precedence over this page.
        </li>
      </ul>
    }
  `,
  styles: `
    h2 {
      font-size: 1.15rem;
      margin: 0 0 8px;
      color: var(--rh-ink);
    }
    .notice {
      padding-left: 18px;
      line-height: 1.45;
      li {
        margin-bottom: 8px;
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PrivacyNotice {
  readonly facilitators = input<string[]>([]);
  readonly short = input(false);
  protected names(): string {
    return this.facilitators().join(', ') || 'the facilitator';
  }
}
