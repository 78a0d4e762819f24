import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import Handlebars from 'handlebars';
import type { AnalysisResult, DesignInput } from '../../shared/control/index';
import { presentBundle, type BundleView, type ExportMeta } from './presenter';

/** Template names in server/templates (without `.hbs`). */
export type TemplateName = 'coefficients.h' | 'filter.h' | 'filter.c' | 'vectors.h' | 'vectors.c' | 'run_vectors.c' | 'Makefile' | 'REPORT.md';

const TEMPLATE_DIR = fileURLToPath(new URL('../templates/', import.meta.url));
const compiled = new Map<TemplateName, Handlebars.TemplateDelegate<BundleView>>();

/**
 * Renders one template with a view model (no HTML escaping: the outputs are C, make and Markdown,
 * and the presenter makes every printed value safe for its place).
 *
 * @param name - template name.
 * @param view - view model from `presentBundle`.
 * @returns the rendered text.
 */
export function renderTemplate(name: TemplateName, view: BundleView): string {
  let template = compiled.get(name);
  if (!template) {
    const source = readFileSync(`${TEMPLATE_DIR}${name}.hbs`, 'utf8');
    template = Handlebars.compile<BundleView>(source, { noEscape: true, strict: true });
    compiled.set(name, template);
  }
  return template(view);
}

/**
 * The generated coefficient header alone (used for the unified diff between revisions).
 *
 * @param design - validated design.
 * @param analysis - its analysis.
 * @param meta - version, revision, draft flag, tool version and creation time printed in the header.
 * @returns the header text, identical to `include/<slug>_coefs.h` of a bundle with the same inputs.
 */
export function renderCoefficientHeader(design: DesignInput, analysis: AnalysisResult, meta: ExportMeta): string {
  return renderTemplate('coefficients.h', presentBundle(design, analysis, meta, []));
}

/** Alias of {@link renderCoefficientHeader}. */
export const renderHeader = renderCoefficientHeader;
