package dev.circa.validator.render;

import dev.circa.format.io.FormatException;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOutcome;
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

    /**
     * The log of {@code outcomes}: a file that could not be read becomes an error notification of the
     * invocation (its message and location), and the invocation is then not successful.
     */
    public static String render(List<ValidationOutcome> outcomes) {
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
        ArrayNode notifications = F.arrayNode();
        for (ValidationOutcome outcome : outcomes) {
            String uri = outcome.file() == null ? null : uri(outcome.file());
            if (uri != null) {
                artifacts.addObject().putObject("location").put("uri", uri);
            }
            ValidationReport rep = outcome.report();
            if (rep == null) {
                ok = false;
                notify(notifications.addObject(), uri, outcome.failure());
                continue;
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
        ObjectNode invocation = run.putArray("invocations").addObject();
        invocation.put("executionSuccessful", notifications.isEmpty());
        invocation.put("exitCode", ValidationOutcome.exitStatus(outcomes));
        if (!notifications.isEmpty()) {
            invocation.set("toolExecutionNotifications", notifications);
        }
        invocation.putObject("properties").put("valid", ok);
        run.put("columnKind", "unicodeCodePoints");
        return MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(log) + "\n";
    }

    /** A notification for a file from which no model could be built: its message and where. */
    private static void notify(ObjectNode n, String uri, FormatException e) {
        n.put("level", "error");
        n.putObject("message").put("text", e.getMessage());
        if (uri != null) {
            ObjectNode loc = n.putArray("locations").addObject();
            ObjectNode phys = loc.putObject("physicalLocation");
            phys.putObject("artifactLocation").put("uri", uri);
            if (e.line() > 0) {
                ObjectNode region = phys.putObject("region");
                region.put("startLine", e.line());
                region.put("startColumn", Math.max(1, e.column()));
            }
            if (e.pointer() != null && !e.pointer().isEmpty()) {
                ObjectNode logical = loc.putArray("logicalLocations").addObject();
                logical.put("fullyQualifiedName", e.pointer());
                logical.put("kind", "element");
            }
        }
        n.putObject("properties").put("status", 2).put("problem", e.problem());
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
