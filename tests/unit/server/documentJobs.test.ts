import { describe, expect, it } from 'vitest';
import { importPlcopen } from '@shared/ladder/plcopen';
import { exportJob, importJob } from '../../../server/grading/documentJobs';
import { documentWithRungs } from '../../api/helpers/fixtures';

const job = (document: unknown, format: 'json' | 'plcopen') => ({ documentJson: JSON.stringify(document), title: 'Conveyor: Line 2!', version: 3, format, now: '2026-09-01T08:00:00.000Z' });
const text = (bytes: Uint8Array) => new TextDecoder().decode(bytes);

describe('export and import jobs (run in the worker pool)', () => {
  it('exports a version as the JSON document and as PLCopen XML, with a safe file name', () => {
    const json = exportJob(job(documentWithRungs(2), 'json'));
    expect(json.ok && json.value.fileName).toBe('conveyor-line-2-v3.json');
    expect(json.ok && JSON.parse(text(json.value.body)).rungs).toHaveLength(2);
    const xml = exportJob(job(documentWithRungs(2), 'plcopen'));
    expect(xml.ok && xml.value.contentType).toBe('application/xml; charset=utf-8');
    expect(xml.ok && importPlcopen(text(xml.value.body)).ok).toBe(true);
  });

  it('refuses to export a stored document past the size limits, saying where', () => {
    let node: unknown = { kind: 'contact', id: 'c', variant: 'no', operand: '%IX1' };
    for (let i = 0; i < 40; i += 1) node = { kind: 'parallel', id: `p${i}`, branches: [node] };
    const deep = { ...documentWithRungs(1), rungs: [{ id: 'r1', comment: '', network: { kind: 'series', id: 's', items: [node] } }] };
    const result = exportJob(job(deep, 'plcopen'));
    expect(result.ok).toBe(false);
    expect(!result.ok && result.failure).toMatchObject({ code: 'invalid_document', message: expect.stringMatching(/^The program document cannot be opened: .*branches nest more than 32 levels deep in rung 1$/) });
  });

  it('imports an exported file, titled from the file when the project has no title', () => {
    const xml = exportJob(job(documentWithRungs(1, ''), 'plcopen'));
    const imported = importJob({ xml: xml.ok ? text(xml.value.body) : '', fileName: 'line-2.xml' });
    expect(imported.ok && imported.value.program.rungs).toHaveLength(1);
    expect(imported.ok && imported.value.title).toBe('line-2');
    const named = exportJob(job(documentWithRungs(1, 'Named line'), 'plcopen'));
    const back = importJob({ xml: named.ok ? text(named.value.body) : '', fileName: 'other.xml' });
    expect(back.ok && back.value.title).toBe('Named line');
    const refused = importJob({ xml: '<project>\u0000</project>', fileName: 'bad.xml' });
    expect(!refused.ok && refused.failure.code).toBe('invalid_document');
  });
});
