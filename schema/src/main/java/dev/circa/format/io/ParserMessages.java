package dev.circa.format.io;

import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The problems the JSON and YAML parsers report, told in circa's words: what was found at the
 * reported line and column and what was expected there. No parser's wording, token names or
 * feature names reach the user; a problem not recognised here becomes a general statement about
 * the syntax at that place (the location still points at it).
 */
public final class ParserMessages {
    /** The fixed guard against hash flooding: property names with colliding hashes in one document. */
    public static final String NAME_TABLE_LIMIT = "the limit on property names with colliding hashes";

    private static final Pattern CHARACTER = Pattern.compile("Unexpected character \\('(.+?)' \\(code (\\d+)");
    private static final Pattern CONTROL = Pattern.compile("\\(CTRL-CHAR, code (\\d+)\\)");
    private static final Pattern QUOTED = Pattern.compile("\"([^\"]*)\"");
    private static final Pattern TOKEN = Pattern.compile("Unrecognized token '([^']*)'");
    private static final Pattern CLOSE = Pattern.compile("Unexpected close marker '(.)': expected '(.)'");
    private static final Pattern ESCAPE = Pattern.compile("Unrecognized character escape '(.+?)'");
    private static final Pattern UTF8 = Pattern.compile("Invalid UTF-8 (start|middle) byte (0x[0-9a-fA-F]+)");
    private static final Pattern YAML_FOUND = Pattern.compile("expected (.+?), but (?:found|got) '?(<[^>]+>|[^']*)'?$");
    private static final Pattern YAML_DUPLICATE = Pattern.compile("found duplicate key (.*)");
    private static final Pattern YAML_CHAR = Pattern.compile("found character '(.*)' that cannot start any token");

    private ParserMessages() {
    }

    /** A JSON parser's problem ({@code original}: its message) in circa's words. */
    public static String json(String original) {
        String m = original == null ? "" : firstLine(original);
        if (m.contains("symbol table") || m.contains("SYMBOL_HASH_OVERFLOW")) {
            return "too many different property names with colliding hashes (" + NAME_TABLE_LIMIT
                    + ", a fixed guard against hash flooding); a circa document uses a few dozen different names";
        }
        if (m.contains("Duplicate Object property") || m.startsWith("Duplicate field")) {
            Matcher q = QUOTED.matcher(m);
            return "duplicate key" + (q.find() ? " \"" + q.group(1) + "\"" : "") + "; every key may appear once in an object";
        }
        if (m.contains("'NaN'") || m.contains("Infinity'") || m.contains("ALLOW_NON_NUMERIC_NUMBERS")) {
            return "NaN and Infinity are not JSON numbers; expected a finite number";
        }
        if (m.startsWith("Unexpected end-of-input")) {
            return "the input ends before the document is complete (is the file truncated?)";
        }
        if (m.contains("ALLOW_COMMENTS") || m.contains("comment")) {
            return "not valid JSON: comments are not allowed in JSON";
        }
        if (m.contains("UCS-4") || m.contains("UTF-32") || m.contains("Invalid UTF-16") || m.contains("surrogate")) {
            return "not valid JSON: the bytes are not valid text in the encoding they start in; expected UTF-8, UTF-16 or UTF-32";
        }
        Matcher u = UTF8.matcher(m);
        if (u.find()) {
            return "not valid JSON: the byte " + u.group(2).toLowerCase(Locale.ROOT) + " cannot " + (u.group(1).equals("start") ? "start" : "continue")
                    + " a UTF-8 character; expected UTF-8, UTF-16 or UTF-32 text";
        }
        if (m.startsWith("Illegal unquoted character")) {
            Matcher c = CONTROL.matcher(m);
            return "not valid JSON: the control character " + (c.find() ? codePoint(c.group(1)) + " " : "")
                    + "must be written as an escape inside a string (\\n, \\t, \\u0000...)";
        }
        Matcher esc = ESCAPE.matcher(m);
        if (esc.find()) {
            return "not valid JSON: unknown escape \\" + esc.group(1) + " in a string; expected one of \\\" \\\\ \\/ \\b \\f \\n \\r \\t \\uXXXX";
        }
        if (m.contains("Leading zeroes not allowed") || m.contains("leading zero")) {
            return "not valid JSON: a number may not start with 0 followed by more digits";
        }
        if (m.startsWith("Invalid numeric value") || m.contains("Expected space separating root-level values")
                || m.contains("Decimal point not followed by a digit") || m.contains("Exponent indicator not followed")) {
            return "not valid JSON: not a number as JSON writes them";
        }
        Matcher close = CLOSE.matcher(m);
        if (close.find()) {
            return "not valid JSON: unexpected '" + close.group(1) + "'; expected '" + close.group(2) + "' to close what is open";
        }
        String found = found(m);
        String expected = expected(m);
        if (found != null || expected != null) {
            return "not valid JSON: " + (found == null ? "unexpected input" : "unexpected " + found) + "; expected " + (expected == null ? "a JSON value" : expected);
        }
        return "not valid JSON: the syntax is broken here";
    }

    /** What a JSON parser's message says was found, or {@code null}. */
    private static String found(String m) {
        Matcher t = TOKEN.matcher(m);
        if (t.find()) {
            return "word '" + abbreviate(t.group(1)) + "'";
        }
        Matcher c = CONTROL.matcher(m);
        if (m.startsWith("Unexpected character") && c.find()) {
            return "control character " + codePoint(c.group(1));
        }
        Matcher ch = CHARACTER.matcher(m);
        if (ch.find()) {
            return "character '" + ch.group(1) + "'";
        }
        return null;
    }

    /** What a JSON parser's message says was expected, or {@code null}. */
    private static String expected(String m) {
        if (m.contains("double-quote to start property name") || m.contains("double-quote to start field name")) {
            return "a property name in double quotes";
        }
        if (m.contains("comma to separate Object entries")) {
            return "',' before the next member, or '}'";
        }
        if (m.contains("comma to separate Array entries")) {
            return "',' before the next element, or ']'";
        }
        if (m.contains("colon to separate")) {
            return "':' after the property name";
        }
        if (m.contains("expected a valid value") || m.contains("was expecting")) {
            return "a JSON value (a string, number, object, array, true, false or null)";
        }
        return null;
    }

    /**
     * A YAML parser's problem in circa's words.
     *
     * @param problem the parser's statement of the problem
     * @param context what the parser was reading (may be {@code null})
     */
    public static String yaml(String problem, String context) {
        String p = problem == null ? "" : firstLine(problem).trim();
        Matcher dup = YAML_DUPLICATE.matcher(p);
        if (dup.find()) {
            return "duplicate key " + dup.group(1).trim() + "; every key may appear once in a mapping";
        }
        Matcher ch = YAML_CHAR.matcher(p);
        if (ch.find()) {
            String c = ch.group(1);
            if (c.startsWith("\\t")) {
                return "a tab where indentation or a value was expected; YAML indents with spaces";
            }
            return "the character '" + c + "' cannot start a value here; put the value in quotes";
        }
        if (p.startsWith("mapping values are not allowed")) {
            return "a 'key: value' pair where none can start; quote a value that contains ': ', or check the indentation";
        }
        if (p.startsWith("could not find expected ':'")) {
            return "a key without ':' after it; expected 'key: value'";
        }
        if (p.contains("found unexpected end of stream")) {
            return "the input ends inside a quoted value or a bracket; close it";
        }
        if (p.contains("found undefined tag handle") || p.contains("tag")) {
            return "a YAML tag is not allowed in a mixture document; expected an untagged value";
        }
        Matcher f = YAML_FOUND.matcher(p);
        if (f.find()) {
            String expected = yamlToken(f.group(1));
            String found = yamlToken(f.group(2));
            if (f.group(1).contains("<block end>")) {
                return "found " + found + " where the indented block above should end; check the indentation of this line"
                        + " against the lines above it";
            }
            return "found " + found + " where " + expected + " was expected";
        }
        if (p.contains("control") || p.contains("special characters are not allowed")) {
            return "a control character that YAML does not allow; remove it or write it as an escape in a double-quoted string";
        }
        return "the syntax is broken here (check the indentation, the quoting and the ':' and '- ' markers)";
    }

    /** A YAML parser's token name as the text a user writes. */
    private static String yamlToken(String t) {
        String s = t.trim();
        if (s.startsWith("'") && s.endsWith("'") && s.length() >= 2) {
            s = s.substring(1, s.length() - 1);
        }
        switch (s) {
            case "<block end>":
                return "the end of an indented block";
            case "<block mapping start>":
                return "a new indented 'key: value' block";
            case "<block sequence start>":
                return "a list item ('- ')";
            case "<block entry>":
                return "a list item ('- ')";
            case "<scalar>":
                return "a value";
            case "<key>":
                return "a key";
            case "<value>":
                return "a ':' and value";
            case "<flow mapping start>":
                return "'{'";
            case "<flow mapping end>":
                return "'}'";
            case "<flow sequence start>":
                return "'['";
            case "<flow sequence end>":
                return "']'";
            case "<flow entry>":
                return "','";
            case "<document start>":
                return "a document start ('---')";
            case "<document end>":
                return "a document end ('...')";
            case "<stream end>":
                return "the end of the input";
            case "<anchor>":
                return "an anchor ('&')";
            case "<alias>":
                return "an alias ('*')";
            case "<tag>":
                return "a tag ('!')";
            default:
                break;
        }
        if (s.contains("<") || s.contains(">")) {
            return "something else";
        }
        if (s.startsWith("','") || s.contains(" or ")) {
            return s.replace("<block end>", "the end of an indented block");
        }
        return s.isEmpty() ? "something else" : "'" + s + "'";
    }

    private static String codePoint(String decimal) {
        try {
            return String.format(Locale.ROOT, "U+%04X", Integer.parseInt(decimal));
        } catch (NumberFormatException e) {
            return "";
        }
    }

    private static String abbreviate(String s) {
        return s.length() > 40 ? s.substring(0, 37) + "..." : s;
    }

    private static String firstLine(String s) {
        int i = s.indexOf('\n');
        return i < 0 ? s : s.substring(0, i);
    }
}
