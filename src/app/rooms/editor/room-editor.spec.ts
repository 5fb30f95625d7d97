import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Observable } from 'rxjs';
import { errorInterceptor } from '../../core/error-interceptor';
import type { RoomDto } from '../../../../shared/api/rooms';
import { RoomEditor } from './room-editor';

const ROOM: RoomDto = {
  id: 5,
  name: 'Test room',
  description: '',
  settings: { directed: false, minutesPerHop: 5, laziness: 0, mixing: 0 },
  version: 3,
  access: 'owner',
  ownerName: 'Owner',
  people: [
    { id: 11, key: 'A', name: 'Ana', group: 'North', email: null, x: 0, y: 0, pinned: false },
    { id: 12, key: 'B', name: 'Bo', group: 'North', email: null, x: 50, y: 0, pinned: false },
  ],
  ties: [{ id: 21, sourceId: 11, targetId: 12, strength: 2 }],
  updatedAt: '2026-01-01T00:00:00Z',
};

/** Follows a save round; the testing backend answers at once, so it has ended when the answer was flushed. */
function ended(round: Observable<void>): () => boolean {
  let done = false;
  round.subscribe({ complete: () => (done = true) });
  return () => done;
}

/** Autosave through the batch endpoint (behind the app's error interceptor), and the "changed elsewhere" choice after a 409. */
describe('RoomEditor saving', () => {
  let editor: RoomEditor;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(withInterceptors([errorInterceptor])), provideHttpClientTesting(), provideRouter([]), RoomEditor],
    });
    editor = TestBed.inject(RoomEditor);
    http = TestBed.inject(HttpTestingController);
    editor.load(5);
    http.expectOne('/api/rooms/5').flush(ROOM);
  });

  afterEach(() => http.verify());

  it('sends a change with the version, takes the new version and maps the new ids', async () => {
    const lid = editor.addPerson({ name: 'Cy', group: 'South' });
    editor.addTie(lid, 'p11', 3);
    expect(editor.saveState()).toBe('unsaved');
    const saving = ended(editor.flush());
    const req = http.expectOne('/api/rooms/5/edits');
    expect(req.request.body.version).toBe(3);
    expect(req.request.body.ops.map((o: { op: string }) => o.op)).toEqual(['addPerson', 'addTie']);
    expect(req.request.body.ops[1].source).toBe(lid);
    expect(req.request.body.ops[1].target).toBe(11);
    req.flush({ version: 4, layoutOnly: false, people: { [lid]: 13 }, ties: { [req.request.body.ops[1].tempId]: 22 } });
    expect(saving()).withContext('the save round has ended').toBeTrue();
    expect(editor.saveState()).toBe('saved');
    expect(editor.room()!.version).toBe(4);
    // Undo of the new tie now deletes it by its server id.
    editor.undo();
    const undoing = ended(editor.flush());
    const undoReq = http.expectOne('/api/rooms/5/edits');
    expect(undoReq.request.body.ops).toEqual([{ op: 'deleteTie', id: 22 }]);
    undoReq.flush({ version: 5, layoutOnly: false, people: {}, ties: {} });
    expect(undoing()).withContext('the save round has ended').toBeTrue();
  });

  it('a stale version keeps the change; "keep mine" sends it again on top of the newer version', async () => {
    editor.updatePerson('p11', { name: 'Ana Lima' });
    const saving = ended(editor.flush());
    http.expectOne('/api/rooms/5/edits').flush(
      {
        error: {
          code: 'stale_version',
          message: 'This room was changed elsewhere: reload or keep yours.',
          details: { currentVersion: 7, yourVersion: 3, message: 'x' },
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    expect(saving()).withContext('the save round has ended').toBeTrue();
    expect(editor.saveState()).toBe('conflict');
    expect(editor.conflict()?.currentVersion).toBe(7);
    expect(editor.model.person('p11').name).toBe('Ana Lima');
    editor.keepMine();
    const again = http.expectOne('/api/rooms/5/edits');
    expect(again.request.body).toEqual({ version: 7, ops: [{ op: 'updatePerson', id: 11, name: 'Ana Lima' }] });
    again.flush({ version: 8, layoutOnly: false, people: {}, ties: {} });
    await new Promise((r) => setTimeout(r));
    expect(editor.saveState()).toBe('saved');
  });

  it('a failed save shows the message, keeps the change and retries', async () => {
    editor.setTieStrength('t21', 6);
    const saving = ended(editor.flush());
    http
      .expectOne('/api/rooms/5/edits')
      .flush(
        { error: { code: 'database_unavailable', message: 'The database is not answering.' } },
        { status: 503, statusText: 'Unavailable' },
      );
    expect(saving()).withContext('the save round has ended').toBeTrue();
    expect(editor.saveState()).toBe('failed');
    expect(editor.saveError()).toContain('The database is not answering.');
    editor.retry();
    const again = http.expectOne('/api/rooms/5/edits');
    expect(again.request.body.ops).toEqual([{ op: 'updateTie', id: 21, strength: 6 }]);
    again.flush({ version: 4, layoutOnly: false, people: {}, ties: {} });
    await new Promise((r) => setTimeout(r));
    expect(editor.saveState()).toBe('saved');
  });

  it('a save refused while another large change is being written stays queued and is sent again by itself', async () => {
    jasmine.clock().install();
    try {
      editor.setTieStrength('t21', 6);
      const saving = ended(editor.flush());
      http
        .expectOne('/api/rooms/5/edits')
        .flush(
          { error: { code: 'busy_writing', message: 'You already have 1 large change being saved.' } },
          { status: 429, statusText: 'Too Many Requests' },
        );
      expect(saving()).withContext('the save round has ended').toBeTrue();
      expect(editor.saveState()).toBe('unsaved');
      expect(editor.saveError()).toContain('You already have 1 large change being saved.');
      http.expectNone('/api/rooms/5/edits');
      jasmine.clock().tick(3000);
      const again = http.expectOne('/api/rooms/5/edits');
      expect(again.request.body.ops).toEqual([{ op: 'updateTie', id: 21, strength: 6 }]);
      again.flush({ version: 4, layoutOnly: false, people: {}, ties: {} });
    } finally {
      jasmine.clock().uninstall();
    }
    await new Promise((r) => setTimeout(r));
    expect(editor.saveState()).toBe('saved');
  });

  it('the automatic resend waits as long as the Retry-After of the server asks', async () => {
    jasmine.clock().install();
    try {
      editor.setTieStrength('t21', 7);
      const saving = ended(editor.flush());
      http
        .expectOne('/api/rooms/5/edits')
        .flush(
          { error: { code: 'busy_writing', message: 'You already have 2 large changes being saved.' } },
          { status: 429, statusText: 'Too Many Requests', headers: { 'Retry-After': '6' } },
        );
      expect(saving()).withContext('the save round has ended').toBeTrue();
      expect(editor.saveError()).toContain('send it again in 6 seconds');
      jasmine.clock().tick(5000);
      http.expectNone('/api/rooms/5/edits');
      jasmine.clock().tick(1500);
      const again = http.expectOne('/api/rooms/5/edits');
      expect(again.request.body.ops).toEqual([{ op: 'updateTie', id: 21, strength: 7 }]);
      again.flush({ version: 4, layoutOnly: false, people: {}, ties: {} });
    } finally {
      jasmine.clock().uninstall();
    }
    await new Promise((r) => setTimeout(r));
    expect(editor.saveState()).toBe('saved');
  });

  it('moves alone are layout-only (no version); a viewer cannot change anything', async () => {
    editor.movePeople([{ lid: 'p12', x: 80, y: 9, pinned: true }]);
    const saving = ended(editor.flush());
    const req = http.expectOne('/api/rooms/5/edits');
    expect(req.request.body).toEqual({ ops: [{ op: 'movePeople', moves: [{ id: 12, x: 80, y: 9, pinned: true }] }] });
    req.flush({ version: 3, layoutOnly: true, people: {}, ties: {} });
    expect(saving()).withContext('the save round has ended').toBeTrue();

    editor.load(5);
    http.expectOne('/api/rooms/5').flush({ ...ROOM, access: 'viewer' });
    editor.deletePeople(['p11']);
    expect(editor.model.people.size).toBe(2);
    expect(editor.history().canUndo).toBeFalse();
  });
});
