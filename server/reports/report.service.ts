import type { EntityManager } from 'typeorm';
import { renderPdf } from './pdf.js';
import { loadReportData } from './report-data.service.js';
import type { ScreeningReportData } from './report-data.js';
import { buildReportDocDefinition } from './screening-report.js';

/** A stored screening's PDF report with the data it was built from and its file name. */
export async function screeningReportPdf(m: EntityManager, screeningId: number, appUrl: string): Promise<{ data: ScreeningReportData; pdf: Buffer; filename: string }> {
  const data = await loadReportData(m, screeningId, appUrl);
  const pdf = await renderPdf(buildReportDocDefinition(data));
  return { data, pdf, filename: `gapsight-${data.unit.serial}-screening-${data.screening.id}.pdf` };
}
