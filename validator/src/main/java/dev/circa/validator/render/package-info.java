/**
 * Writers of validation reports as text, JSON and SARIF 2.1.0, behind {@link dev.circa.validator.ReportFormat};
 * not for application code.
 */
package dev.circa.validator.render;
