package dev.circa.spark;

import dev.circa.format.Counts;
import dev.circa.model.Model;
import dev.circa.model.ModelException;
import dev.circa.validator.Diagnostic;
import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.io.Serializable;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.zip.GZIPInputStream;

/**
 * A circuit as shipped to executors: the file's bytes, read and checked once on the driver and
 * compiled once per executor JVM (a cache keyed by the bytes' SHA-256), whatever the number of tasks.
 */
public final class SparkModel implements Serializable {
    private static final long serialVersionUID = 1L;
    private static final Map<String, CompiledCircuit> COMPILED = new ConcurrentHashMap<>();

    private final String file;
    private final byte[] bytes;
    private final String key;
    private final long maxBytes;
    private final long maxNodes;
    private final int maxDepth;
    private final int maxString;
    private final int maxNumber;
    private transient Model loaded;

    private SparkModel(String file, byte[] bytes, ReadLimits limits, Model loaded) {
        this.file = file;
        this.bytes = bytes;
        this.key = sha256(bytes);
        this.maxBytes = limits.maxBytes();
        this.maxNodes = limits.maxNodes();
        this.maxDepth = limits.maxDepth();
        this.maxString = limits.maxString();
        this.maxNumber = limits.maxNumber();
        this.loaded = loaded;
    }

    /**
     * Reads and checks {@code path} as every circa command does (smooth and decomposable, valid
     * references and parameters; warnings to {@code err}).
     *
     * @throws FormatException when the file cannot be used, with the validator's diagnostics on {@code err}
     */
    public static SparkModel load(Path path, ReadLimits limits, PrintWriter err) throws FormatException {
        return load(path, null, limits, err);
    }

    /**
     * Like {@link #load(Path, ReadLimits, PrintWriter)}, but when {@code certificate} is not {@code null} the
     * file's bytes are checked against it (SHA-256 and size, hashed while read) instead of validating again.
     *
     * @throws FormatException when the file cannot be used or does not match its certificate
     */
    public static SparkModel load(Path path, Path certificate, ReadLimits limits, PrintWriter err) throws FormatException {
        Model model;
        try {
            model = certificate == null ? Model.loader().withLimits(limits).load(path)
                    : Model.loader().withLimits(limits).load(path, certificate);
        } catch (ModelException e) {
            if (e.unreadable()) {
                throw e;
            }
            for (Diagnostic d : e.diagnostics().subList(0, Math.min(20, e.diagnostics().size()))) {
                err.println(path + ": " + d.render());
            }
            throw new FormatException(path.toString(), 0, 0, null, "cannot be used: " + Counts.of(e.diagnostics().size(), "error")
                    + " found by the validator (listed above; a circuit must at least be smooth and "
                    + "decomposable, with valid references and parameters; run circa validate for the full report)");
        }
        try {
            return new SparkModel(path.toString(), Files.readAllBytes(path), limits, model);
        } catch (IOException e) {
            throw new FormatException(path.toString(), 0, 0, null, "cannot be read: " + e.getMessage());
        }
    }

    /** The read limits the file was read with (to read other inputs of the same run). */
    public ReadLimits limits() {
        return new ReadLimits(maxBytes, maxNodes, maxDepth, maxString, maxNumber);
    }

    /** The file name as given. */
    public String file() {
        return file;
    }

    /** The circuit as read and checked on the driver (compiled here when this copy was deserialised). */
    public Model driverModel() {
        if (loaded == null) {
            throw new IllegalStateException("the checked model lives on the driver only");
        }
        return loaded;
    }

    /** The compiled circuit, compiled at most once per JVM for the same bytes. */
    public CompiledCircuit compiled() {
        if (loaded != null) {
            return loaded.circuit();
        }
        return COMPILED.computeIfAbsent(key, k -> compile());
    }

    /** The names of the compiled circuit's outputs, in order (as a reference set's reader takes them). */
    java.util.List<String> outputNames() {
        CompiledCircuit c = compiled();
        java.util.List<String> names = new java.util.ArrayList<>();
        for (int o = 0; o < c.outputCount(); o++) {
            names.add(c.outputName(o));
        }
        return names;
    }

    private CompiledCircuit compile() {
        try (InputStream in = open()) {
            return CompiledCircuit.compile(new dev.circa.format.io.CircuitReader(limits()).read(in, file));
        } catch (FormatException | CompileException e) {
            throw new IllegalStateException(file + " was checked on the driver but cannot be compiled here: " + e.getMessage(), e);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private InputStream open() throws IOException {
        InputStream in = new ByteArrayInputStream(bytes);
        boolean gzip = bytes.length > 1 && (bytes[0] & 0xff) == 0x1f && (bytes[1] & 0xff) == 0x8b;
        return gzip ? new GZIPInputStream(in) : in;
    }

    private static String sha256(byte[] b) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(b));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is part of every Java platform", e);
        }
    }
}
