package dev.circa.format.mixture;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ParserMessages;
import tools.jackson.core.JacksonException;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;
import tools.jackson.core.TokenStreamLocation;
import tools.jackson.core.exc.StreamConstraintsException;
import tools.jackson.core.exc.StreamReadException;
import tools.jackson.core.util.JsonParserDelegate;
import tools.jackson.dataformat.yaml.JacksonYAMLParseException;
import tools.jackson.dataformat.yaml.YAMLParser;
import org.snakeyaml.engine.v2.exceptions.Mark;
import org.snakeyaml.engine.v2.exceptions.MarkedYamlEngineException;

/**
 * Narrows a YAML parser to the part of YAML 1.2 a mixture document may use: no anchors or aliases
 * (so nothing can expand beyond what was written), no explicit tags, and no {@code .inf} or
 * {@code .nan}. Also turns YAML syntax errors and unlocated limit errors into located messages.
 * Problems are raised as a {@link JacksonException} whose cause is the {@link FormatException},
 * which {@link dev.circa.format.io.JsonInput} passes through unchanged.
 */
final class YamlGuard extends JsonParserDelegate {
    /** The YAML 1.2 core schema's spellings of infinity and NaN (yaml.org spec 1.2.2, section 10.3.2). */
    private static final java.util.regex.Pattern NON_FINITE =
            java.util.regex.Pattern.compile("[-+]?\\.(inf|Inf|INF)|\\.(nan|NaN|NAN)");

    private final String file;

    YamlGuard(JsonParser yaml, String file) {
        super(yaml);
        this.file = file;
    }

    @Override
    public JsonToken nextToken() {
        JsonToken t;
        try {
            t = delegate.nextToken();
        } catch (JacksonYAMLParseException e) {
            throw fail(syntax(e));
        } catch (StreamConstraintsException e) {
            if (e.getLocation() == null) {
                throw new StreamConstraintsException(e.getOriginalMessage(), delegate.currentLocation());
            }
            throw e;
        }
        if (t == null) {
            return null;
        }
        YAMLParser y = (YAMLParser) delegate;
        if (y.isCurrentAlias()) {
            throw fail(here("the YAML alias *" + y.getText() + " is not allowed in a mixture document; "
                    + "expected a plain value (share a sub-model with definitions and use)"));
        }
        if (t != JsonToken.END_OBJECT && t != JsonToken.END_ARRAY && y.getObjectId() != null
                && t != JsonToken.PROPERTY_NAME) {
            throw fail(here("the YAML anchor &" + y.getObjectId() + " is not allowed in a mixture document; "
                    + "expected a plain value (share a sub-model with definitions and use)"));
        }
        if (t != JsonToken.END_OBJECT && t != JsonToken.END_ARRAY && y.getRawTag() != null) {
            throw fail(here("the YAML tag " + y.getRawTag() + " is not allowed in a mixture document; "
                    + "expected an untagged value"));
        }
        if (t == JsonToken.VALUE_NUMBER_FLOAT || t == JsonToken.VALUE_STRING) {
            String s = y.getText();
            if (NON_FINITE.matcher(s).matches()) {
                throw fail(here(s + " (a YAML infinity or NaN) is not allowed in a mixture document; "
                        + "expected a finite number"));
            }
        }
        return t;
    }

    private FormatException here(String problem) {
        TokenStreamLocation l = delegate.currentTokenLocation();
        int line = l == null ? 0 : Math.max(0, l.getLineNr());
        int col = l == null ? 0 : Math.max(0, l.getColumnNr());
        return new FormatException(file, line, col, null, problem);
    }

    private FormatException syntax(JacksonYAMLParseException e) {
        Throwable c = e.getCause();
        if (c instanceof MarkedYamlEngineException m) {
            Mark mark = m.getProblemMark().orElse(m.getContextMark().orElse(null));
            String problem = m.getProblem() == null ? "" : m.getProblem();
            String context = m.getContext();
            String text = "not valid YAML: " + ParserMessages.yaml(problem, context);
            if (mark != null) {
                return new FormatException(file, mark.getLine() + 1, mark.getColumn() + 1, null, text);
            }
            return new FormatException(file, 0, 0, null, text);
        }
        TokenStreamLocation l = e.getLocation();
        String msg = e.getOriginalMessage() == null ? "" : e.getOriginalMessage();
        int nl = msg.indexOf('\n');
        return new FormatException(file, l == null ? 0 : Math.max(0, l.getLineNr()),
                l == null ? 0 : Math.max(0, l.getColumnNr()), null,
                "not valid YAML: " + ParserMessages.yaml(nl < 0 ? msg : msg.substring(0, nl), null));
    }

    private StreamReadException fail(FormatException problem) {
        return new StreamReadException(delegate, problem.problem(), problem);
    }
}
