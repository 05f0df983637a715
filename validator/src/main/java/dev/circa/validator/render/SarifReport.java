package dev.circa.validator.render;

import dev.circa.validator.Diagnostic;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.rules.Rule;
import dev.circa.validator.rules.Rules;
import java.net.URI;
import java.net.URISyntaxException;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import tools.jackson.databind.ObjectMapper;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * Validation reports as one SARIF 2.1.0 log (the OASIS standard): one run, the rule registry as
 * the driver's rules, one result per diagnostic with a physical location (file, line, column) and
 * the JSON pointer as a logical location.
 */
public final class SarifReport {
    /** Where the schema of the log is published. */
    public static final String SCHEMA = "https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json";
    /** The tool version written in the log. */
    public static final String TOOL_VERSION = "0.1.0";

    private static final ObjectMapper MAPPER = JsonMapper.builder().build();
    private static final JsonNodeFactory F = JsonNodeFactory.instance;

    private SarifReport() {
    }

    public static String render(List<ValidationReport> reports) {
        ObjectNode log = F.objectNode();
        log.put("$schema", SCHEMA);
        log.put("version", "2.1.0");
        ObjectNode run = log.putArray("runs").addObject();
        ObjectNode driver = run.putObject("tool").putObject("driver");
        driver.put("name", "circa");
        driver.put("version", TOOL_VERSION);
        driver.put("semanticVersion", TOOL_VERSION);
        ArrayNode rules = driver.putArray("rules");
        Map<String, Integer> index = new HashMap<>();
        for (Rule r : Rules.all()) {
            index.put(r.id(), index.size());
            ObjectNode x = rules.addObject();
            x.put("id", r.id());
            x.put("name", r.id());
            x.putObject("shortDescription").put("text", r.summary());
            String doc = RuleDocs.section(r.id());
            if (doc != null) {
                x.putObject("fullDescription").put("text", doc);
            }
            x.putObject("defaultConfiguration").put("level", level(r.severity()));
            x.putObject("properties").put("guards", r.guards().name().toLowerCase(java.util.Locale.ROOT));
        }
        ArrayNode artifacts = run.putArray("artifacts");
        ArrayNode results = run.putArray("results");
        boolean ok = true;
        for (ValidationReport rep : reports) {
            String uri = rep.file() == null ? null : uri(rep.file());
            if (uri != null) {
                artifacts.addObject().putObject("location").put("uri", uri);
            }
            ok &= rep.valid();
            for (Diagnostic d : rep.diagnostics()) {
                ObjectNode res = results.addObject();
                res.put("ruleId", d.code());
                Integer ri = index.get(d.code());
                if (ri != null) {
                    res.put("ruleIndex", ri.intValue());
                }
                res.put("level", level(d.severity()));
                res.putObject("message").put("text", d.message());
                ObjectNode loc = res.putArray("locations").addObject();
                if (uri != null) {
                    ObjectNode phys = loc.putObject("physicalLocation");
                    phys.putObject("artifactLocation").put("uri", uri);
                    if (d.hasLineColumn()) {
                        ObjectNode region = phys.putObject("region");
                        region.put("startLine", d.line());
                        region.put("startColumn", Math.max(1, d.column()));
                    }
                }
                ObjectNode logical = loc.putArray("logicalLocations").addObject();
                logical.put("fullyQualifiedName", d.pointer().isEmpty() ? "/" : d.pointer());
                logical.put("kind", "element");
                if (d.node() != null) {
                    res.putObject("properties").put("node", d.node().intValue());
                }
            }
        }
        run.putArray("invocations").addObject().put("executionSuccessful", true)
                .putObject("properties").put("valid", ok);
        run.put("columnKind", "unicodeCodePoints");
        return MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(log) + "\n";
    }

    /** SARIF levels: error, warning, note. */
    static String level(Severity s) {
        return switch (s) {
            case ERROR -> "error";
            case WARNING -> "warning";
            case INFO -> "note";
        };
    }

    /** A relative URI reference for a file name (separators to slashes, other characters escaped). */
    static String uri(String file) {
        String path = file.replace('\\', '/');
        try {
            return new URI(null, null, path, null).toASCIIString();
        } catch (URISyntaxException e) {
            return null;
        }
    }
}
