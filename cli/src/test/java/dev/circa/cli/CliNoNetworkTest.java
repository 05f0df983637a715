package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.converter.mixture.MixtureConverter;
import dev.circa.converter.mixture.MixtureOptions;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureReader;
import dev.circa.format.schema.SchemaCatalog;
import dev.circa.validator.SchemaCheck;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.net.SocketTimeoutException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.ObjectMapper;

/**
 * No command fetches what a document names (issue 8): a circuit naming a schema and {@code $ref}s on
 * a local server, at the top level, in its variables and in its extensions, is read, evaluated,
 * imputed, sampled, checked, compared, normalised, rendered, reported and validated against the bundled schemas
 * while the server counts zero connections. The server listens on the
 * loopback address only and stops with the test.
 */
class CliNoNetworkTest {
    @TempDir
    Path dir;
    private ServerSocket server;
    private Thread acceptor;
    private final AtomicInteger connections = new AtomicInteger();
    private volatile boolean open = true;

    @BeforeEach
    void listen() throws IOException {
        server = new ServerSocket(0, 50, InetAddress.getLoopbackAddress());
        server.setSoTimeout(100);
        acceptor = new Thread(() -> {
            while (open) {
                try (Socket s = server.accept()) {
                    connections.incrementAndGet();
                } catch (SocketTimeoutException e) {
                    // poll the flag again
                } catch (IOException e) {
                    return;
                }
            }
        }, "no-network-listener");
        acceptor.setDaemon(true);
        acceptor.start();
    }

    @AfterEach
    void close() throws Exception {
        open = false;
        server.close();
        acceptor.join(5000);
    }

    /**
     * The example naming the local server: in its extensions only when {@code everywhere} is false
     * (a valid circuit), else also at the top level and in a variable (unknown properties: errors).
     */
    private Path circuitNamingTheServer(boolean everywhere) throws IOException {
        String url = "http://127.0.0.1:" + server.getLocalPort();
        String doc = Files.readString(Cli.EXAMPLE)
                .replace("\"checks\":", "\"extensions\": {\"$schema\": \"" + url + "/ext\", \"$ref\": \"" + url
                        + "/ref#/defs/a\", \"nested\": {\"$ref\": \"" + url + "/deeper\"}}, \"checks\":");
        if (everywhere) {
            doc = doc.replaceFirst("\\{", "{\"\\$schema\": \"" + url + "/circuit.schema.json\", \"\\$id\": \"" + url + "/id\",")
                    .replace("{\"name\": \"inlet_pressure\", \"type\": \"real\"",
                            "{\"$ref\": \"" + url + "/variable#/x\", \"name\": \"inlet_pressure\", \"type\": \"real\"");
        }
        assertTrue(doc.contains("\"$schema\"") && doc.contains("\"$ref\"") && doc.contains("\"extensions\""), doc);
        Path p = dir.resolve(everywhere ? "names-a-server-everywhere.json" : "names-a-server.json");
        Files.writeString(p, doc);
        return p;
    }

    @Test
    void validator_documentNamingSchemaAndRefUrls_validatedWithoutConnection() throws Exception {
        for (boolean everywhere : new boolean[] {false, true}) {
            Path circuit = circuitNamingTheServer(everywhere);
            Path gz = dir.resolve(circuit.getFileName() + ".gz");
            Files.write(gz, CliMalformedInputTest.gzip(Files.readAllBytes(circuit)));
            Validator v = new Validator(ValidationOptions.defaults(), SchemaCheck.BUNDLED);
            for (Path p : List.of(circuit, gz)) {
                ValidationReport report = v.validate(p, ReadLimits.DEFAULT);
                assertEquals(p.toString(), report.file());
                assertEquals(!everywhere, report.valid(), p.toString());
            }
        }
        assertEquals(0, connections.get(), "connections while validating");
    }

    @Test
    void mixture_documentNamingSchemaAndRefUrls_readValidatedAndConvertedWithoutConnection() throws Exception {
        String url = "http://127.0.0.1:" + server.getLocalPort();
        String yaml = Files.readString(Path.of("..", "fixtures", "mixtures", "pump-station-regimes.yaml"))
                + "\nextensions:\n  $schema: " + url + "/mixture.schema.json\n  $ref: " + url + "/ref#/x\n"
                + "  nested: {$id: " + url + "/id, $ref: " + url + "/deeper}\n";
        Path y = dir.resolve("names-a-server.yaml");
        Files.writeString(y, yaml);
        MixtureDocument fromYaml = MixtureReader.read(y, ReadLimits.DEFAULT);
        MixtureConverter.convert(fromYaml, MixtureOptions.DEFAULT);
        Cli.Result converted = Cli.run("convert", y.toString(), "-o", dir.resolve("converted.json").toString(), "--verify", "200");
        assertEquals(ExitStatus.OK, converted.status(), converted::describe);
        Cli.Result valid = Cli.run("validate", dir.resolve("converted.json").toString(), "--schema-check", "always");
        assertEquals(ExitStatus.OK, valid.status(), valid::describe);
        // the same document as JSON, with a $schema member at the top level too (an unknown property)
        ObjectMapper json = new ObjectMapper();
        tools.jackson.databind.node.ObjectNode tree = (tools.jackson.databind.node.ObjectNode)
                new ObjectMapper(new tools.jackson.dataformat.yaml.YAMLFactory()).readTree(yaml);
        SchemaCatalog.get().validate(SchemaCatalog.Kind.MIXTURE, tree);
        tree.put("$schema", url + "/top.schema.json");
        Path j = dir.resolve("names-a-server.json");
        Files.writeString(j, json.writeValueAsString(tree));
        SchemaCatalog.get().validate(SchemaCatalog.Kind.MIXTURE, tree);
        try {
            MixtureConverter.convert(MixtureReader.read(j, ReadLimits.DEFAULT), MixtureOptions.DEFAULT);
        } catch (dev.circa.format.io.FormatException e) {
            assertTrue(e.getMessage().contains("$schema"), e.getMessage());
        }
        assertEquals(0, connections.get(), "connections while reading and converting mixtures");
    }

    @Test
    void everyCommand_documentNamingSchemaAndRefUrls_noConnection() throws Exception {
        Path data = dir.resolve("readings.csv");
        Files.copy(Cli.READINGS, data);
        for (boolean everywhere : new boolean[] {false, true}) {
            Path circuit = circuitNamingTheServer(everywhere);
            // a valid circuit is used (0); one with unknown top-level members is invalid (validate 1, the others 2)
            int expected = everywhere ? ExitStatus.UNUSABLE : ExitStatus.OK;
            List<String[]> runs = new ArrayList<>();
            runs.add(new String[] {"eval", circuit.toString(), "--data", data.toString(), "-o", dir.resolve("e.csv").toString()});
            runs.add(new String[] {"impute", circuit.toString(), "--data", data.toString(), "-o", dir.resolve("i.csv").toString()});
            runs.add(new String[] {"sample", circuit.toString(), "-n", "20", "-o", dir.resolve("s.csv").toString()});
            runs.add(new String[] {"inspect", circuit.toString()});
            runs.add(new String[] {"check", circuit.toString()});
            runs.add(new String[] {"compare", circuit.toString(), Cli.EXAMPLE.toString(), "--samples", "50"});
            runs.add(new String[] {"normalize", circuit.toString(), "-o", dir.resolve("n.json").toString()});
            runs.add(new String[] {"render", circuit.toString(), "-o", dir.resolve("r.dot").toString()});
            runs.add(new String[] {"report", circuit.toString(), "-o", dir.resolve("r.html").toString()});
            for (String[] args : runs) {
                Cli.Result r = Cli.run(args);
                Cli.assertNoStackTrace(r);
                if (!args[0].equals("inspect") || !everywhere) {
                    assertEquals(expected, r.status(), r::describe);
                }
            }
            for (String format : List.of("text", "json", "sarif")) {
                Cli.Result r = Cli.run("validate", circuit.toString(), "--format", format, "--schema-check", "always");
                assertEquals(everywhere ? ExitStatus.FAILED : ExitStatus.OK, r.status(), r::describe);
            }
        }
        // a check that the listener counts: one connection of our own, then none from circa
        int before = connections.get();
        assertEquals(0, before, "connections while circa ran");
        try (Socket s = new Socket(InetAddress.getLoopbackAddress(), server.getLocalPort())) {
            assertTrue(s.isConnected());
        }
        long deadline = System.nanoTime() + 5_000_000_000L;
        while (connections.get() == 0 && System.nanoTime() < deadline) {
            Thread.sleep(10);
        }
        assertEquals(1, connections.get(), "the listener saw our own connection");
    }
}
