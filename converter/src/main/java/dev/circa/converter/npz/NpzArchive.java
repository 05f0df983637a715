package dev.circa.converter.npz;

import dev.circa.format.io.AtomicOutput;
import dev.circa.format.io.FormatException;
import java.io.BufferedInputStream;
import java.io.ByteArrayOutputStream;
import java.io.FilterInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.time.LocalDateTime;
import java.util.Collections;
import java.util.Enumeration;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.zip.CRC32;
import java.util.zip.CheckedInputStream;
import java.util.zip.ZipEntry;
import java.util.zip.ZipException;
import java.util.zip.ZipFile;
import java.util.zip.ZipInputStream;
import java.util.zip.ZipOutputStream;

/**
 * A NumPy {@code .npz} archive: a zip file whose entries {@code NAME.npy} are {@code .npy} arrays
 * (what {@code numpy.savez} and {@code numpy.savez_compressed} write), read into memory as
 * {@link NpyArray}s keyed by {@code NAME}. Entries may be stored or deflated, with or without data
 * descriptors. An entry name is only a key: it is never used as a file path, so names such as
 * {@code ../x.npy} or {@code /x.npy} are read like any other.
 *
 * <p>Immutable once read; safe to share between threads.
 */
public final class NpzArchive {
    private static final LocalDateTime ENTRY_TIME = LocalDateTime.of(1980, 1, 1, 0, 0);

    private final String source;
    private final Map<String, NpyArray> arrays;

    private NpzArchive(String source, Map<String, NpyArray> arrays) {
        this.source = source;
        this.arrays = Collections.unmodifiableMap(arrays);
    }

    /** An archive of {@code arrays} made in code (for export); names must be unique. */
    public static NpzArchive of(List<NpyArray> arrays) {
        Map<String, NpyArray> m = new LinkedHashMap<>();
        for (NpyArray a : arrays) {
            if (m.put(a.name(), a) != null) {
                throw new IllegalArgumentException("two arrays are named " + a.name());
            }
        }
        return new NpzArchive(null, m);
    }

    /**
     * Reads the archive at {@code path} through its central directory.
     *
     * @param maxBytes the most uncompressed bytes read from all entries together ({@code --max-bytes})
     * @throws FormatException when the file is not a zip archive or an entry is not a supported array;
     *     the message names the file and the array
     */
    public static NpzArchive read(Path path, long maxBytes) throws FormatException {
        String file = path.toString();
        if (file.equals("-")) {
            return read(System.in, "-", maxBytes);
        }
        if (Files.isDirectory(path)) {
            throw new FormatException(file, 0, 0, null, "is a directory, expected an .npz file");
        }
        Map<String, NpyArray> out = new LinkedHashMap<>();
        long budget = maxBytes;
        try (ZipFile zip = new ZipFile(path.toFile())) {
            ZipEnd.check(path, file);
            Enumeration<? extends ZipEntry> entries = zip.entries();
            while (entries.hasMoreElements()) {
                ZipEntry e = entries.nextElement();
                String key = keyOf(e, file);
                long limit = e.getSize() >= 0 ? Math.min(budget, e.getSize()) : budget;
                try (InputStream in = new BufferedInputStream(zip.getInputStream(e), 1 << 16)) {
                    CheckedInputStream checked = new CheckedInputStream(in, new CRC32());
                    Counting counted = new Counting(checked);
                    NpyArray a = NpyFormat.read(counted, key, file, limit);
                    budget -= counted.count;
                    if (e.getCrc() != -1 && checked.getChecksum().getValue() != e.getCrc()) {
                        throw NpyFormat.problem(file, key, "the zip entry's CRC-32 does not match its data (a damaged file)");
                    }
                    put(out, a, file);
                }
            }
        } catch (NoSuchFileException e) {
            throw new FormatException(file, 0, 0, null, "no such file");
        } catch (FormatException e) {
            throw e;
        } catch (ZipException e) {
            throw new FormatException(file, 0, 0, null, "not an .npz archive (a zip file): " + e.getMessage());
        } catch (IllegalArgumentException e) {
            // java.util.zip reports an entry name that is not valid UTF-8 this way
            throw new FormatException(file, 0, 0, null, "not a readable .npz archive: an entry name is not valid UTF-8 ("
                    + e.getMessage() + ")");
        } catch (IOException e) {
            throw new FormatException(file, 0, 0, null, "cannot be read: " + e.getMessage());
        }
        return new NpzArchive(file, out);
    }

    /**
     * Reads an archive from a stream, entry by entry in file order (no central directory: a stored
     * entry written with a data descriptor cannot be read this way and is reported).
     *
     * @param file names the source in messages
     * @param maxBytes the most uncompressed bytes read from all entries together
     */
    public static NpzArchive read(InputStream stream, String file, long maxBytes) throws FormatException {
        Map<String, NpyArray> out = new LinkedHashMap<>();
        long budget = maxBytes;
        boolean any = false;
        ZipEnd.Keeper kept = new ZipEnd.Keeper(stream);
        try (ZipInputStream zin = new ZipInputStream(new BufferedInputStream(kept, 1 << 16))) {
            ZipEntry e;
            while ((e = zin.getNextEntry()) != null) {
                any = true;
                String key = keyOf(e, file);
                Counting counted = new Counting(zin);
                long limit = e.getSize() >= 0 ? Math.min(budget, e.getSize()) : budget;
                NpyArray a = NpyFormat.read(counted, key, file, limit);
                budget -= counted.count;
                put(out, a, file);
            }
            if (any) {
                kept.drainAndCheck(file);
            }
        } catch (FormatException e) {
            throw e;
        } catch (ZipException e) {
            throw new FormatException(file, 0, 0, null, "not a readable .npz archive (a zip file): " + e.getMessage());
        } catch (IllegalArgumentException e) {
            // java.util.zip reports an entry name that is not valid UTF-8 this way
            throw new FormatException(file, 0, 0, null, "not a readable .npz archive: an entry name is not valid UTF-8 ("
                    + e.getMessage() + ")");
        } catch (IOException e) {
            throw new FormatException(file, 0, 0, null, "cannot be read: " + e.getMessage());
        }
        if (!any) {
            throw new FormatException(file, 0, 0, null, "not an .npz archive: no zip entries found");
        }
        return new NpzArchive(file, out);
    }

    private static String keyOf(ZipEntry e, String file) throws FormatException {
        String n = e.getName();
        if (e.isDirectory() || !n.endsWith(".npy")) {
            throw new FormatException(file, 0, 0, null, String.format(Locale.ROOT,
                    "the entry \"%s\" is not an array; every entry of an .npz archive is NAME.npy", n));
        }
        return n.substring(0, n.length() - 4);
    }

    private static void put(Map<String, NpyArray> out, NpyArray a, String file) throws FormatException {
        if (out.put(a.name(), a) != null) {
            throw NpyFormat.problem(file, a.name(), "appears twice in the archive");
        }
    }

    /** The file the archive was read from, or {@code null} when made in code. */
    public String source() {
        return source;
    }

    /** The array names in archive order. */
    public List<String> names() {
        return List.copyOf(arrays.keySet());
    }

    /** The arrays in archive order. */
    public List<NpyArray> arrays() {
        return List.copyOf(arrays.values());
    }

    /** The array named {@code name}, or {@code null}. */
    public NpyArray get(String name) {
        return arrays.get(name);
    }

    /** Whether there is an array named {@code name}. */
    public boolean contains(String name) {
        return arrays.containsKey(name);
    }

    /** Number of arrays. */
    public int size() {
        return arrays.size();
    }

    /**
     * Writes the arrays to {@code target} whole or not at all, each as float64 in C order
     * ({@link NpyFormat#write}), in archive order, with a fixed entry time so that the same
     * arrays give the same bytes.
     *
     * @param compressed deflate the entries (as {@code numpy.savez_compressed}) or store them ({@code numpy.savez})
     * @param inputs files the command reads: writing over one of them is refused
     */
    public void write(Path target, boolean compressed, Path... inputs) throws IOException {
        AtomicOutput.write(target, out -> write(out, compressed), inputs);
    }

    /** Writes the arrays as an archive to {@code out} (not closed). */
    public void write(OutputStream out, boolean compressed) throws IOException {
        ZipOutputStream zip = new ZipOutputStream(new dev.circa.format.io.NonClosingOutputStream(out));
        for (NpyArray a : arrays.values()) {
            ZipEntry e = new ZipEntry(a.name() + ".npy");
            e.setTimeLocal(ENTRY_TIME);
            if (compressed) {
                e.setMethod(ZipEntry.DEFLATED);
                zip.putNextEntry(e);
                NpyFormat.write(a, zip);
            } else {
                ByteArrayOutputStream bytes = new ByteArrayOutputStream(128 + 8 * a.size());
                NpyFormat.write(a, bytes);
                byte[] b = bytes.toByteArray();
                CRC32 crc = new CRC32();
                crc.update(b);
                e.setMethod(ZipEntry.STORED);
                e.setSize(b.length);
                e.setCompressedSize(b.length);
                e.setCrc(crc.getValue());
                zip.putNextEntry(e);
                zip.write(b);
            }
            zip.closeEntry();
        }
        zip.finish();
        zip.flush();
    }

    /** Counts bytes read through it. */
    private static final class Counting extends FilterInputStream {
        long count;

        Counting(InputStream in) {
            super(in);
        }

        @Override
        public int read() throws IOException {
            int b = super.read();
            if (b >= 0) {
                count++;
            }
            return b;
        }

        @Override
        public int read(byte[] b, int off, int len) throws IOException {
            int n = super.read(b, off, len);
            if (n > 0) {
                count += n;
            }
            return n;
        }

        @Override
        public void close() {
            // the entry stream is closed by its owner
        }
    }
}
