package dev.circa.validator.rules;

import dev.circa.validator.Severity;
import java.lang.annotation.Documented;
import java.lang.annotation.ElementType;
import java.lang.annotation.Retention;
import java.lang.annotation.RetentionPolicy;
import java.lang.annotation.Target;

/** The metadata of a {@link Rule}, on its class. */
@Documented
@Retention(RetentionPolicy.RUNTIME)
@Target(ElementType.TYPE)
public @interface RuleInfo {
    /** Stable id: the diagnostic code and the key of {@code --rule ID:off|warn|error}. */
    String id();

    /** One line, no final period. */
    String summary();

    /** The severity of its diagnostics unless the rule or {@code --rule} says otherwise. */
    dev.circa.validator.Severity severity();

    /** What the rule guards. */
    Aspect guards();
}
