import { renderPdf } from './layout';
import { sectionPages } from './section-pages';
import type { SectionReportInput } from './types';

/**
 * The report of one section as a PDF: the title block with the review record, the inputs, the
 * methods and their references, and for each case its results, drawing, search, warnings and
 * the slice table of its governing method; the caution and "page n of m" on every page.
 *
 * @example await sectionReportPdf({ section, result: analyzeSection(section), meta: { date, solverVersion } })
 */
export function sectionReportPdf(input: SectionReportInput): Promise<Buffer> {
  const { section } = input;
  return renderPdf(
    `Section report ${section.id}: ${section.title}`,
    { subject: 'Slope-stability section report', author: input.meta.submittedBy },
    (l) => sectionPages(l, input),
  );
}
