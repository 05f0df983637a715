package dev.circa.model;

import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.InputFiles;
import dev.circa.format.io.ReadLimits;
import dev.circa.validator.Validator;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Path;
import java.util.Objects;

/**
 * Loads circuits into {@link Model}s: reads one in a single streaming pass under named
 * {@link ReadLimits}, proves it fit to serve under a {@link Requirement} with the validator, and
 * compiles it. Immutable: the {@code with...} methods return a copy, and one loader may be shared by
 * any number of threads. Defaults: {@link ReadLimits#DEFAULT}, {@link Requirement#DEFAULT},
 * {@link ReadHook#NONE}.
 *
 * <pre>{@code
 * Model model = Model.loader()
 *         .withLimits(ReadLimits.DEFAULT.withMaxNodes(1_000_000))
 *         .withRequirement(Requirement.also(Property.DETERMINISTIC))
 *         .load(Path.of("model.json.gz"));
 * }</pre>
 */
public final class ModelLoader {
    private static final ModelLoader DEFAULT = new ModelLoader(ReadLimits.DEFAULT, Requirement.DEFAULT, ReadHook.NONE);

    private final ReadLimits limits;
    private final Requirement requirement;
    private final ReadHook hook;

    private ModelLoader(ReadLimits limits, Requirement requirement, ReadHook hook) {
        this.limits = Objects.requireNonNull(limits, "limits");
        this.requirement = Objects.requireNonNull(requirement, "requirement");
        this.hook = Objects.requireNonNull(hook, "hook");
    }

    /** The loader with every default. */
    static ModelLoader defaults() {
        return DEFAULT;
    }

    /**
     * This loader with other read limits.
     *
     * @param l the limits on bytes, nodes, nesting depth, string and number length
     * @return a new loader
     */
    public ModelLoader withLimits(ReadLimits l) {
        return new ModelLoader(l, requirement, hook);
    }

    /**
     * This loader with another requirement.
     *
     * @param r what must be proven before the model is served
     * @return a new loader
     */
    public ModelLoader withRequirement(Requirement r) {
        return new ModelLoader(limits, r, hook);
    }

    /**
     * This loader with a hook that sees the stored bytes of each file as they are read.
     *
     * @param h the hook
     * @return a new loader
     */
    public ModelLoader withReadHook(ReadHook h) {
        return new ModelLoader(limits, requirement, h);
    }

    /**
     * The read limits.
     *
     * @return the limits
     */
    public ReadLimits limits() {
        return limits;
    }

    /**
     * The requirement.
     *
     * @return what must be proven
     */
    public Requirement requirement() {
        return requirement;
    }

    /**
     * The read hook.
     *
     * @return the hook, {@link ReadHook#NONE} by default
     */
    public ReadHook readHook() {
        return hook;
    }

    /**
     * Loads the circuit file {@code file}: gzip-decompressed when its name ends in {@code .gz},
     * standard input when it is {@code -}.
     *
     * @param file the circuit file
     * @return the model
     * @throws ModelException when the file cannot be read, or the circuit is not proven fit to serve
     */
    public Model load(Path file) throws ModelException {
        return accept(check(file));
    }

    /**
     * Loads a circuit from {@code in}, gzip-decompressed when {@code source} ends in {@code .gz}. The
     * stream is read to the end of the document and closed.
     *
     * @param in input: the circuit's bytes as stored
     * @param source the name of the input in messages
     * @return the model
     * @throws ModelException when the input cannot be read, or the circuit is not proven fit to serve
     */
    public Model load(InputStream in, String source) throws ModelException {
        return accept(check(in, source));
    }

    /**
     * Reads and validates the circuit file {@code file} as {@link #load(Path)} does, without refusing it
     * when the validator finds errors and without compiling it: for tools that describe a circuit.
     *
     * @param file the circuit file
     * @return the document and the validator's report
     * @throws ModelException when the file cannot be read
     */
    public CheckedCircuit check(Path file) throws ModelException {
        String name = InputFiles.displayName(file);
        if (hook == ReadHook.NONE) {
            // no one watches the stored bytes: the reader may take a stored file's nodes straight from its
            // bytes, on two threads when it is large (CircuitReader.read(Path)), as circa validate does
            try {
                return validate(name, new CircuitReader(limits).read(file));
            } catch (FormatException e) {
                throw ModelException.unreadable(e);
            }
        }
        InputStream stored;
        try {
            stored = InputFiles.openStored(file);
        } catch (FormatException e) {
            throw ModelException.unreadable(e);
        }
        Path fileName = file.getFileName();
        boolean gzip = fileName != null && InputFiles.isGzipName(fileName.toString());
        return validate(name, read(stored, name, gzip, gzip ? null : file));
    }

    /**
     * Reads and validates a circuit from {@code in} as {@link #load(InputStream, String)} does, without
     * refusing it when the validator finds errors and without compiling it.
     *
     * @param in input: the circuit's bytes as stored
     * @param source the name of the input in messages
     * @return the document and the validator's report
     * @throws ModelException when the input cannot be read
     */
    public CheckedCircuit check(InputStream in, String source) throws ModelException {
        return validate(source, read(in, source, InputFiles.isGzipName(source)));
    }

    /**
     * Proves a document already in memory (built in code or produced by a converter) fit to serve and
     * compiles it. The read limits and the read hook do not apply: nothing is read.
     *
     * @param doc the document
     * @return the model
     * @throws ModelException when the circuit is not proven fit to serve
     */
    public Model load(CircuitDocument doc) throws ModelException {
        return accept(validate(doc.source() == null ? "<document>" : doc.source(), doc));
    }

    /**
     * Loads the circuit file {@code file} with its certificate: the file's stored bytes are hashed while
     * they are read (one pass) and, when they are the certified ones and the certificate is intact and
     * proves at least this loader's requirement, the circuit is served without validating it again.
     *
     * @param file the circuit file ({@code .gz} decompressed)
     * @param certificate its certificate, written by {@link Certifier}
     * @return the model, its report rebuilt from the certificate
     * @throws ModelException when either file cannot be read; a {@link CertificateMismatchException} when
     *     the certificate was edited, proves less than required, or is not of these bytes
     */
    public Model load(Path file, Path certificate) throws ModelException {
        dev.circa.format.certificate.Certificate cert = CertificateCheck.read(certificate, limits);
        String certName = InputFiles.displayName(certificate);
        CertificateCheck.checkSeal(cert, certName);
        CertificateCheck.checkCovers(cert, requirement, certName);
        String name = InputFiles.displayName(file);
        DigestingInputStream d = openDigested(file);
        CircuitDocument doc;
        try {
            // the stream is hashed as it is read; a second thread may read part of the nodes from the file,
            // taken only when the stream's bytes of that part hash the same (CircuitReader.readAlongside)
            doc = read(d, name, isGzip(file), isGzip(file) ? null : file);
        } catch (ModelException e) {
            try {
                d.finish(cert.model().bytes());
            } catch (IOException ignored) {
                d.abort();
                throw e;
            }
            // a read error in a file that is not the certified one: the mismatch is the reason
            CertificateCheck.checkBytes(cert, certName, d, file, e);
            throw e;
        }
        try {
            d.finish(cert.model().bytes());
        } catch (IOException e) {
            throw ModelException.unreadable(new FormatException(name, 0, 0, null, "cannot be read: " + e.getMessage()));
        }
        CertificateCheck.checkBytes(cert, certName, d, file, null);
        return new Model(name, doc, CertificateCheck.report(cert, name), compile(name, doc), requirement);
    }

    /** Opens {@code file}'s stored bytes, hashed as they are read. */
    static DigestingInputStream openDigested(Path file) throws ModelException {
        try {
            return new DigestingInputStream(InputFiles.openStored(file));
        } catch (FormatException e) {
            throw ModelException.unreadable(e);
        }
    }

    static boolean isGzip(Path file) {
        Path fileName = file.getFileName();
        return fileName != null && InputFiles.isGzipName(fileName.toString());
    }

    /** Reads a circuit from its stored bytes under the limits and the hook; closes {@code stored}. */
    CircuitDocument read(InputStream stored, String name, boolean gzip) throws ModelException {
        return read(stored, name, gzip, null);
    }

    /** The same; {@code sameFile}, when given, is the file the stored bytes are read from. */
    private CircuitDocument read(InputStream stored, String name, boolean gzip, Path sameFile) throws ModelException {
        CircuitDocument doc;
        InputStream observed = stored;
        try {
            observed = hook.wrap(stored, name);
            try (InputStream in = InputFiles.decoded(observed, name, gzip, limits.maxBytes())) {
                doc = sameFile == null ? new CircuitReader(limits).read(in, name)
                        : new CircuitReader(limits).readAlongside(in, name, sameFile);
            }
        } catch (FormatException e) {
            closeAfterFailure(observed);
            throw ModelException.unreadable(e);
        } catch (IOException e) {
            closeAfterFailure(observed);
            throw ModelException.unreadable(new FormatException(name, 0, 0, null, "cannot be read: " + e.getMessage()));
        }
        return doc;
    }

    private CheckedCircuit validate(String name, CircuitDocument doc) {
        return new CheckedCircuit(name, doc, new Validator(requirement.validationOptions()).validate(doc));
    }

    private Model accept(CheckedCircuit checked) throws ModelException {
        if (!checked.fit()) {
            throw ModelException.invalid(checked.source(), checked.report(), requirement);
        }
        return new Model(checked.source(), checked.document(), checked.report(),
                compile(checked.source(), checked.document()), requirement);
    }

    static CompiledCircuit compile(String name, CircuitDocument doc) throws ModelException {
        try {
            return CompiledCircuit.compile(doc);
        } catch (CompileException e) {
            throw ModelException.unreadable(new FormatException(name, 0, 0, null, e.getMessage()));
        }
    }

    private static void closeAfterFailure(InputStream in) {
        try {
            in.close();
        } catch (IOException ignored) {
            // the read already failed with its own message
        }
    }
}
