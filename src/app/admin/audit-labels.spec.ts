import { auditAction, auditChange, auditConcerns } from './audit-labels';

describe('audit labels', () => {
  it('names workshop actions in words, never as raw codes', () => {
    expect(auditAction({ action: 'workshop.debrief_released' })).toBe('Released the debrief');
    expect(auditAction({ action: 'workshop.links_reissued' })).toBe('Reissued participant links');
    expect(auditAction({ action: 'something.new' })).toBe('Other: something.new');
  });

  it('reads status moves with the status names the workshop page uses', () => {
    expect(auditChange({ action: 'workshop.status', detail: { from: 'collecting', to: 'running' } })).toBe('Collecting answers → Running');
    expect(auditChange({ action: 'workshop.links_emailed', detail: { sent: 1 } })).toBe('1 person');
  });

  it('shows the workshop and the account it belongs to', () => {
    const base = { targetType: 'workshop', targetId: '7', detail: null };
    expect(auditConcerns({ ...base, targetEmail: 'noor@example.test', targetLabel: 'Spring day' })).toBe(
      'Workshop “Spring day” · noor@example.test',
    );
    expect(auditConcerns({ ...base, targetEmail: null, targetLabel: null, detail: { title: 'Gone day' } })).toBe('Workshop “Gone day”');
    expect(auditConcerns({ targetType: 'user', targetId: '3', targetEmail: 'ada@example.test', targetLabel: null, detail: null })).toBe(
      'ada@example.test',
    );
  });
});
