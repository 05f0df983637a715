/**
 * The circuit validator: {@link dev.circa.validator.Validator} turns a circuit document into a
 * {@link dev.circa.validator.ValidationReport}, which {@link dev.circa.validator.ReportFormat}
 * renders as text, JSON or SARIF. Used by the {@code circa validate} command and by every command
 * that checks its inputs first.
 */
package dev.circa.validator;
