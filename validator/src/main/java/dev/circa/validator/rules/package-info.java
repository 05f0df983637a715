/**
 * The validator's rules, one final class per defect, each with a stable id (the diagnostic code and
 * the key of {@code --rule}), a summary, a severity and the property it guards; {@link
 * dev.circa.validator.rules.Rules} lists them. Used by {@link dev.circa.validator.Validator}, and by
 * tools that list or document rules.
 */
package dev.circa.validator.rules;
