package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.ReadLimits;
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

/**
 * No command fetches what a document names (issue 8): a circuit naming a schema and {@code $ref}s on
 * a local server, at the top level, in its variables and in its extensions, is read, evaluated,
 * imputed, sampled and validated against the bundled schemas while the server counts zero connections. The server listens on the
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

    /** The example with the local server's address wherever a document could name a schema or a reference. */
    private Path circuitNamingTheServer() throws IOException {
        String url = "http://127.0.0.1:" + server.getLocalPort();
        String doc = Files.readString(Cli.EXAMPLE)
                .replaceFirst("\\{", "{\"\\$schema\": \"" + url + "/circuit.schema.json\", \"\\$id\": \"" + url + "/id\",")
                .replace("{\"name\": \"inlet_pressure\", \"type\": \"real\"",
                        "{\"$ref\": \"" + url + "/variable#/x\", \"name\": \"inlet_pressure\", \"type\": \"real\"")
                .replace("\"checks\":", "\"extensions\": {\"$schema\": \"" + url + "/ext\", \"$ref\": \"" + url
                        + "/ref#/defs/a\", \"nested\": {\"$ref\": \"" + url + "/deeper\"}}, \"checks\":");
        assertTrue(doc.contains("\"$schema\"") && doc.contains("\"$ref\"") && doc.contains("\"extensions\""), doc);
        Path p = dir.resolve("names-a-server.json");
        Files.writeString(p, doc);
        return p;
    }

    @Test
    void validator_documentNamingSchemaAndRefUrls_validatedWithoutConnection() throws Exception {
        Path circuit = circuitNamingTheServer();
        Path gz = dir.resolve("names-a-server.json.gz");
        Files.write(gz, CliMalformedInputTest.gzip(Files.readAllBytes(circuit)));
        Validator v = new Validator(ValidationOptions.defaults(), SchemaCheck.BUNDLED);
        for (Path p : List.of(circuit, gz)) {
            ValidationReport report = v.validate(p, ReadLimits.DEFAULT);
            assertEquals(p.toString(), report.file());
        }
        assertEquals(0, connections.get(), "connections while validating");
    }

    @Test
    void everyCommand_documentNamingSchemaAndRefUrls_noConnection() throws Exception {
        Path circuit = circuitNamingTheServer();
        Path data = dir.resolve("readings.csv");
        Files.copy(Cli.READINGS, data);
        List<String[]> runs = new ArrayList<>();
        runs.add(new String[] {"eval", circuit.toString(), "--data", data.toString(), "-o", dir.resolve("e.csv").toString()});
        runs.add(new String[] {"impute", circuit.toString(), "--data", data.toString(), "-o", dir.resolve("i.csv").toString()});
        runs.add(new String[] {"sample", circuit.toString(), "-n", "20", "-o", dir.resolve("s.csv").toString()});
        for (String[] args : runs) {
            Cli.Result r = Cli.run(args);
            assertEquals(ExitStatus.OK, r.status(), r::describe);
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
