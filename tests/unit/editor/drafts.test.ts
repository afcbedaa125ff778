// @vitest-environment happy-dom
/**
 * Drafts on the workbench (`useDrafts`): kept a few seconds after the last edit, never sooner;
 * offered back on opening only when newer than the head; a restored draft is an edit of the head
 * based on its own version; a saved version or an undo back to it leaves no draft behind.
 */
import { beforeEach, describe, expect, it } from 'vitest';
import { effectScope, nextTick, ref } from 'vue';
import { createPinia, setActivePinia } from 'pinia';
import type { Draft, SaveDraftRequest } from '@shared/api/drafts';
import { setOperand } from '@shared/ladder/edits';
import { DRAFT_DELAY_MS, useDrafts, type DraftTimers } from '@/components/editor/useDrafts';
import type { DraftsApi } from '@/api/drafts';
import { useEditorStore } from '@/stores/editor';
import { threeWire } from './fixtures';

/** Timers the test moves by hand. */
function fakeTimers() {
  let now = 0;
  let pending: { at: number; run: () => void; id: number }[] = [];
  let next = 1;
  const timers: DraftTimers = {
    set: (run, ms) => {
      pending.push({ at: now + ms, run, id: next });
      return next++;
    },
    clear: (id) => {
      pending = pending.filter((p) => p.id !== id);
    },
  };
  return {
    timers,
    async advance(ms: number) {
      now += ms;
      const due = pending.filter((p) => p.at <= now);
      pending = pending.filter((p) => p.at > now);
      for (const p of due) p.run();
      await Promise.resolve();
      await nextTick();
    },
  };
}

/** An API that remembers what was sent. */
function fakeApi(stored: Draft | null = null) {
  const calls: string[] = [];
  let draft = stored;
  const api: DraftsApi = {
    get: async () => draft,
    save: async (_id: string, body: SaveDraftRequest) => {
      calls.push(`save v${body.baseVersion}`);
      draft = { programId: 'p1', baseVersion: body.baseVersion, document: body.document, updatedAt: '2026-09-01T14:02:05.000Z' };
      return draft;
    },
    discard: async () => {
      calls.push('discard');
      draft = null;
    },
    sendOnLeave: () => calls.push('send on leave'),
  };
  return { api, calls, current: () => draft };
}

function setup(stored: Draft | null = null) {
  const editor = useEditorStore();
  editor.load(threeWire());
  const clock = fakeTimers();
  const server = fakeApi(stored);
  const baseVersion = ref(3);
  const drafts = effectScope().run(() => useDrafts({ programId: () => 'p1', baseVersion, active: () => true, api: server.api, timers: clock.timers }))!;
  return { editor, clock, server, baseVersion, drafts };
}

const editOperand = (editor: ReturnType<typeof useEditorStore>, operand: string) =>
  editor.edit((doc) => setOperand(doc, { elementId: 'k1', operand }), 'operand:k1');

beforeEach(() => setActivePinia(createPinia()));

describe('drafts while editing', () => {
  it('are sent once, a few seconds after the last edit, with the base version', async () => {
    const { editor, clock, server, drafts } = setup();
    editOperand(editor, '%QX2');
    await nextTick();
    await clock.advance(DRAFT_DELAY_MS - 1);
    editOperand(editor, '%QX3');
    await nextTick();
    await clock.advance(DRAFT_DELAY_MS - 1);
    expect(server.calls).toEqual([]);
    await clock.advance(1);
    expect(server.calls).toEqual(['save v3']);
    expect((server.current()!.document as ReturnType<typeof threeWire>).rungs[0]!.network.items[2]).toMatchObject({ operand: '%QX3' });
    expect(drafts.keptAt.value).toBe('2026-09-01T14:02:05.000Z');
  });

  it('are dropped when the edits are undone back to the saved document, and forgotten after a save', async () => {
    const { editor, clock, server, drafts } = setup();
    editOperand(editor, '%QX2');
    await nextTick();
    await clock.advance(DRAFT_DELAY_MS);
    editor.undo();
    await nextTick();
    await clock.advance(0);
    expect(server.calls).toEqual(['save v3', 'discard']);
    editOperand(editor, '%QX4');
    await nextTick();
    drafts.saved();
    editor.markSaved();
    await clock.advance(DRAFT_DELAY_MS);
    expect(server.calls).toEqual(['save v3', 'discard']);
  });

  it('go out at once, without waiting, when the page is hidden or closed', async () => {
    const { editor, server, drafts } = setup();
    editOperand(editor, '%QX2');
    await nextTick();
    drafts.sendOnLeave();
    expect(server.calls).toEqual(['send on leave']);
  });
});

describe('a draft found on opening', () => {
  const head = threeWire();
  const newer = (document: unknown, updatedAt = '2026-09-01T14:02:00.000Z'): Draft => ({ programId: 'p1', baseVersion: 2, document, updatedAt });

  it('is offered when newer than the head; restored, it is an undoable edit based on its own version', async () => {
    const changed = setOperand(head, { elementId: 'k1', operand: '%QX5' });
    const { editor, baseVersion, drafts } = setup(newer(changed));
    await drafts.check('2026-09-01T13:00:00.000Z', editor.doc);
    expect(drafts.offer.value).toMatchObject({ baseVersion: 2, updatedAt: '2026-09-01T14:02:00.000Z' });
    drafts.restore();
    expect(editor.doc).toEqual(changed);
    expect(editor.dirty).toBe(true);
    expect(baseVersion.value).toBe(2);
    editor.undo();
    expect(editor.doc).toEqual(head);
  });

  it('is dropped when it is older than the head, does not parse, or equals the head', async () => {
    for (const stored of [newer(setOperand(head, { elementId: 'k1', operand: '%QX5' }), '2026-09-01T12:00:00.000Z'), newer({ format: 'nonsense' }), newer(head)]) {
      setActivePinia(createPinia());
      const { editor, server, drafts } = setup(stored);
      await drafts.check('2026-09-01T13:00:00.000Z', editor.doc);
      expect(drafts.offer.value).toBeNull();
      expect(server.calls).toEqual(['discard']);
    }
  });

  it('is not written over while the offer waits for an answer, and discarding it drops it on the server', async () => {
    const { editor, clock, server, drafts } = setup(newer(setOperand(head, { elementId: 'k1', operand: '%QX5' })));
    await drafts.check('2026-09-01T13:00:00.000Z', editor.doc);
    editOperand(editor, '%QX6');
    await nextTick();
    await clock.advance(DRAFT_DELAY_MS);
    expect(server.calls).toEqual([]);
    await drafts.discard();
    expect(server.calls).toEqual(['discard']);
    expect(drafts.offer.value).toBeNull();
  });
});
