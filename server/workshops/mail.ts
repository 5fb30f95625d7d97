import { render } from '../mail/templates';
import type { OutgoingMail } from '../mail/transport';

/** "2 Dec 2026": the day style the screens use (UTC, so a calendar day never shifts). */
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const dayLabel = (d: Date) => (Number.isNaN(d.getTime()) ? '' : `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}`);

/** The survey invitation a participant receives; plain text and HTML carry the same words. */
export function surveyLinkMail(p: {
  to: string;
  name: string;
  workshopTitle: string;
  sessionDate: string;
  facilitator: string;
  url: string;
  expiresAt: Date;
}): OutgoingMail {
  const until = dayLabel(p.expiresAt);
  const on = dayLabel(new Date(`${p.sessionDate}T00:00:00Z`));
  return {
    to: p.to,
    subject: `Your link for “${p.workshopTitle}”`,
    ...render({
      heading: `${p.name}, a two-minute question before ${p.workshopTitle}`,
      paragraphs: [
        `${p.facilitator} is running the workshop “${p.workshopTitle}” on ${on} and would like to know whom you usually ask when you need news or help at work.`,
        'The page first tells you what is collected, who sees it and how long it is kept; you decide whether to answer. You can change your answers until the survey closes.',
        `After the session the same link shows your own results. The link is personal: please do not forward it. It works until ${until}.`,
      ],
      action: { label: 'Open my survey', url: p.url },
      footnote: `You get this message because ${p.facilitator} added you to the workshop. If you did not expect it, you can ignore it.`,
    }),
  };
}
