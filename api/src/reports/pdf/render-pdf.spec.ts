import { PDFParse } from 'pdf-parse';
import { describe, expect, it } from 'vitest';
import { fill, loadReportDefinition, REPORT_KEYS } from './report-definition.js';
import { renderReport } from './render-pdf.js';

/** The text of a PDF as pdf.js (through pdf-parse, a general-purpose parser) reads it. */
async function textOf(pdf: Buffer): Promise<{ text: string; pages: number }> {
  const parser = new PDFParse({ data: new Uint8Array(pdf) });
  try {
    const r = await parser.getText();
    return { text: r.text, pages: r.pages.length };
  } finally {
    await parser.destroy();
  }
}

const markSheetData = {
  organisation: 'Kestrel Lane Music School',
  printedOn: '2 December 2026',
  sitting: { title: 'Grade 3 mock — Wednesday', date: '2026-11-18', dateText: '18 November 2026', room: 'Studio 2' },
  // Names outside Latin-1 (ł, ő) need the Latin Extended face: they must come out whole.
  student: { name: 'Zoë Łukasiewicz-Erdős', pupilNumber: 'KL1021' },
  listName: 'Grade 3 technique',
  examiner: 'Ottilie Brandt',
  total: 57,
  outOf: 70,
  percentText: '81.4 %',
  band: 'Distinction',
  requests: [
    {
      number: 1,
      label: 'D harmonic minor scale, hands together',
      criteria: [
        { label: 'Note accuracy', mark: 4, outOf: 5 },
        { label: 'Evenness', mark: 3, outOf: 5 },
      ],
      flags: 'Fingering slip ×1',
      comment: 'Steady at the top; keep the thumb under early.',
    },
    { number: 2, label: 'Chromatic scale from E', notAsked: true, criteria: [] },
  ],
  overallComment: 'A secure, musical performance.',
};

describe('PDF reports from reports/*.report.json', () => {
  it('every definition in reports/ loads and passes its shape', () => {
    for (const key of REPORT_KEYS) expect(loadReportDefinition(key).key).toBe(key);
  });

  it('a mark sheet parses and holds the candidate, the total, the band and the examiner', async () => {
    const pdf = await renderReport(loadReportDefinition('mark-sheet'), markSheetData);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const { text, pages } = await textOf(pdf);
    expect(pages).toBe(1);
    expect(text).toContain('Zoë Łukasiewicz-Erdős');
    expect(text).toContain('57 of 70 (81.4 %)');
    expect(text).toContain('Distinction');
    expect(text).toContain('Ottilie Brandt');
    expect(text).toContain('D harmonic minor scale, hands together');
    expect(text).toContain('Comment: Steady at the top; keep the thumb under early.');
    expect(text).toContain('Not asked on the day');
    // A section whose `when` is absent prints nothing (no health note on this sheet).
    expect(text).not.toContain('Health note');
  });

  it('a long table breaks across pages and repeats its header', async () => {
    const results = Array.from({ length: 120 }, (_, i) => ({ student: `Student ${i + 1}`, sitting: 'Mock', total: i % 70, outOf: 70, percentText: '—', band: 'Pass' }));
    const pdf = await renderReport(loadReportDefinition('class-summary'), {
      organisation: 'Kestrel Lane',
      printedOn: 'today',
      class: { name: 'Thursday Seniors', code: 'THU-SNR', students: 120 },
      period: { from: '2026-09-01', text: '1 Sep 2026 – 31 Aug 2027' },
      summary: { results: 120, meanText: '50 %', medianText: '50 %', bands: [{ label: 'Pass', count: 120, percentText: '100 %' }] },
      sittingCount: 1,
      sittings: [],
      results,
      criteria: [],
    });
    const { text, pages } = await textOf(pdf);
    expect(pages).toBeGreaterThan(2);
    expect(text).toContain('Student 1 Mock 0 / 70');
    expect(text).toContain('Student 120');
    expect(text.match(/Student Sitting Total/g)?.length ?? 0).toBe(pages);
    expect(text).toContain(`Page ${pages} of ${pages}`);
  });

  it('fills placeholders by path and leaves missing ones empty', () => {
    expect(fill('{{a.b}} of {{c}}{{missing}}', { a: { b: 3 }, c: 5 })).toBe('3 of 5');
  });
});
