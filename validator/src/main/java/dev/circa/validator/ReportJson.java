package dev.circa.validator;

import java.io.StringWriter;
import java.util.Locale;
import tools.jackson.core.JsonGenerator;
import tools.jackson.core.PrettyPrinter;
import tools.jackson.core.SerializableString;
import tools.jackson.core.io.CharacterEscapes;
import tools.jackson.core.io.SerializedString;
import tools.jackson.databind.json.JsonMapper;

/**
 * Writes the JSON of a report (CLI.md: {@code check} and {@code compare}) with Jackson in the reports'
 * layout: one line, {@code ": "} and {@code ", "} between members, except that the entries of an array
 * opened with {@link #startLinedArray} stand on lines of their own. Numbers are written as
 * {@link Double#toString(double)} writes them, a non-finite one as {@code null}; the text ends with a
 * line break. Not thread-safe; one instance per report.
 */
public final class ReportJson {
    private static final JsonMapper MAPPER = JsonMapper.builder().build();

    /** How control characters in strings are escaped. */
    public enum Escapes {
        /** {@code \n}, {@code \r}, {@code \t} in their short forms, other control characters as {@code \\u00xx}. */
        SHORT_FORMS,
        /** Every control character as {@code \\u00xx}. */
        UNICODE
    }

    private final StringWriter text = new StringWriter();
    private final Layout layout = new Layout();
    private final JsonGenerator g;

    /** A report whose strings escape control characters as {@code escapes} says. */
    public ReportJson(Escapes escapes) {
        g = MAPPER.writer().with(layout).with(new ControlEscapes(escapes)).createGenerator(text);
    }

    /** The generator to write the report with. */
    public JsonGenerator generator() {
        return g;
    }

    /** Writes {@code name: d}, {@code null} when {@code d} is not finite. */
    public void number(String name, double d) {
        g.writeName(name);
        if (Double.isFinite(d)) {
            g.writeNumber(Double.toString(d));
        } else {
            g.writeNull();
        }
    }

    /** Opens the array {@code name} whose entries each stand on a line of their own. */
    public void startLinedArray(String name) {
        g.writeName(name);
        layout.linedNext = true;
        g.writeStartArray();
    }

    /** Closes the generator and returns the text with its final line break. */
    public String finish() {
        g.close();
        return text.append('\n').toString();
    }

    /** The reports' whitespace; arrays are not nested inside lined arrays. */
    private static final class Layout implements PrettyPrinter {
        private boolean linedNext;
        private long linedDepths;
        private int depth;

        private boolean lined() {
            return (linedDepths >>> depth & 1) != 0;
        }

        @Override
        public void writeRootValueSeparator(JsonGenerator g) {
        }

        @Override
        public void writeStartObject(JsonGenerator g) {
            g.writeRaw('{');
        }

        @Override
        public void writeEndObject(JsonGenerator g, int entries) {
            g.writeRaw('}');
        }

        @Override
        public void writeObjectEntrySeparator(JsonGenerator g) {
            g.writeRaw(", ");
        }

        @Override
        public void writeObjectNameValueSeparator(JsonGenerator g) {
            g.writeRaw(": ");
        }

        @Override
        public void beforeObjectEntries(JsonGenerator g) {
        }

        @Override
        public void writeStartArray(JsonGenerator g) {
            depth++;
            linedDepths = linedNext ? linedDepths | 1L << depth : linedDepths & ~(1L << depth);
            linedNext = false;
            g.writeRaw('[');
        }

        @Override
        public void beforeArrayValues(JsonGenerator g) {
            if (lined()) {
                g.writeRaw("\n  ");
            }
        }

        @Override
        public void writeArrayValueSeparator(JsonGenerator g) {
            g.writeRaw(lined() ? ",\n  " : ", ");
        }

        @Override
        public void writeEndArray(JsonGenerator g, int values) {
            g.writeRaw(lined() && values > 0 ? "\n]" : "]");
            depth--;
        }
    }

    /** Quotes and backslashes as JSON wants them; control characters as the report has always written them. */
    private static final class ControlEscapes extends CharacterEscapes {
        private static final long serialVersionUID = 1L;
        private final Escapes escapes;
        private final int[] codes = CharacterEscapes.standardAsciiEscapesForJSON();

        ControlEscapes(Escapes escapes) {
            this.escapes = escapes;
            for (int c = 0; c < 0x20; c++) {
                codes[c] = CharacterEscapes.ESCAPE_CUSTOM;
            }
        }

        @Override
        public int[] getEscapeCodesForAscii() {
            return codes;
        }

        @Override
        public SerializableString getEscapeSequence(int ch) {
            if (ch >= 0x20) {
                return null;
            }
            if (escapes == Escapes.SHORT_FORMS) {
                switch (ch) {
                    case '\n':
                        return new SerializedString("\\n");
                    case '\r':
                        return new SerializedString("\\r");
                    case '\t':
                        return new SerializedString("\\t");
                    default:
                        break;
                }
            }
            return new SerializedString(String.format(Locale.ROOT, "\\u%04x", ch));
        }
    }
}
