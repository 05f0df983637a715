package dev.circa.model;

/**
 * A circuit file and a certificate that do not go together, or a certificate that does not prove what
 * is required: the model is not served. {@link #reason()} says which; the message says it in words,
 * naming both files. On the command line, exit status 2.
 */
public final class CertificateMismatchException extends ModelException {
    private static final long serialVersionUID = 1L;

    /** Why a certificate was refused. */
    public enum Reason {
        /** The certificate's seal does not match its content: a field was edited after certification. */
        CERTIFICATE_EDITED,
        /** The certificate proves less than the loader requires. */
        WEAKER_REQUIREMENT,
        /** The certificate was made for a file of another name and other bytes. */
        OTHER_FILE,
        /** The file has another size than certified: truncated or extended after certification. */
        SIZE_CHANGED,
        /** The file has the certified size but other bytes: changed after certification. */
        CONTENT_CHANGED
    }

    /** Why the certificate was refused. */
    private final Reason reason;

    CertificateMismatchException(String file, Reason reason, String problem, Throwable cause) {
        super(file, problem, cause);
        this.reason = reason;
    }

    /**
     * Why the certificate was refused.
     *
     * @return the reason
     */
    public Reason reason() {
        return reason;
    }

    /**
     * False: the file may well be readable; it is the certificate that does not fit it.
     *
     * @return false
     */
    @Override
    public boolean unreadable() {
        return false;
    }
}
