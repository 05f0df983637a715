package dev.circa.format.io;

import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import java.util.ArrayList;
import java.util.List;
import tools.jackson.core.JsonToken;

/** Reads the {@code variables} array shared by every document kind (FORMAT.md section 1). */
public final class VariableListReader {
    private VariableListReader() {
    }

    /**
     * Reads the array at the current token.
     *
     * @param in positioned on the array's start
     * @param ptr the array's JSON pointer
     * @param findings receives unknown properties
     */
    public static List<Variable> read(JsonInput in, String ptr, List<ReadFinding> findings) throws FormatException {
        return read(in, ptr, findings, new ArrayList<>());
    }

    /** As {@link #read(JsonInput, String, List)}, adding where each variable starts to {@code starts}. */
    public static List<Variable> read(JsonInput in, String ptr, List<ReadFinding> findings, List<SourceLocation> starts)
            throws FormatException {
        in.expect(JsonToken.START_ARRAY, ptr, "an array of variables");
        List<Variable> vars = new ArrayList<>();
        while (in.nextElement()) {
            String p = ptr + "/" + vars.size();
            int line = in.line();
            int col = in.column();
            starts.add(new SourceLocation(p, line, col));
            in.expect(JsonToken.START_OBJECT, p, "a variable object {\"name\": ..., \"type\": ...}");
            String name = null;
            VariableType type = null;
            List<String> states = null;
            String unit = null;
            String description = null;
            String m;
            while ((m = in.nextProperty()) != null) {
                String q = p + "/" + m;
                switch (m) {
                    case "name" -> name = in.readString(q);
                    case "type" -> {
                        String t = in.readString(q);
                        type = VariableType.fromJsonName(t);
                        if (type == null) {
                            throw in.error(q, "unknown variable type \"" + t + "\"; expected real, binary, categorical or count");
                        }
                    }
                    case "states" -> {
                        in.expect(JsonToken.START_ARRAY, q, "an array of state labels");
                        states = new ArrayList<>();
                        while (in.nextElement()) {
                            states.add(in.readString(q + "/" + states.size()));
                        }
                    }
                    case "unit" -> unit = in.readString(q);
                    case "description" -> description = in.readString(q);
                    default -> {
                        findings.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY,
                                "unknown property \"" + m + "\" in a variable", new SourceLocation(q, in.line(), in.column())));
                        in.skipValue();
                    }
                }
            }
            if (name == null) {
                throw new FormatException(in.file(), line, col, p, "a variable needs a \"name\"");
            }
            if (type == null) {
                throw new FormatException(in.file(), line, col, p, "variable \"" + name
                        + "\" needs a \"type\" (real, binary, categorical or count)");
            }
            vars.add(new Variable(name, type, states, unit, description));
        }
        return vars;
    }
}
