/** Render a report in the chosen format. Pure: input in, string out. */
import type { ReportFormat, ReportInput } from './report-input.js';
import { renderTextReport } from './render-text-report.js';
import { renderMarkdownReport } from './render-markdown-report.js';
import { renderHtmlReport } from './render-html-report.js';
import { renderJsonReport } from './render-json-report.js';

export function renderReport(input: ReportInput, format: ReportFormat): string {
  switch (format) {
    case 'text': return renderTextReport(input);
    case 'md': return renderMarkdownReport(input);
    case 'html': return renderHtmlReport(input);
    case 'json': return renderJsonReport(input);
  }
}
