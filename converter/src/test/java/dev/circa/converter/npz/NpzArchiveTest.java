package dev.circa.converter.npz;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.FormatException;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.zip.ZipEntry;
import java.util.zip.ZipOutputStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.ObjectMapper;
import tools.jackson.databind.json.JsonMapper;

/**
 * The .npy layout used by the hand-made files below (magic, version bytes, little-endian header
 * length, Python dict header padded with spaces and ended by a newline, then raw values) is the one
 * NumPy publishes in its format description (numpy.lib.format, "NEP 1"), here from memory; the
 * NumPy-written fixtures check the same reader against NumPy itself.
 */
class NpzArchiveTest {
    private static final Path NPZ = Path.of("..", "fixtures", "npz");
    private static final ObjectMapper JSON = JsonMapper.builder().build();

    @TempDir
    Path tmp;

    @Test
    void read_numpySavezAndSavezCompressed_everyArrayAsArraysJsonLists() throws IOException {
        // Source: fixtures/npz/arrays.npz, arrays-compressed.npz and arrays.json, written by NumPy 1.24.
        JsonNode expected = JSON.readTree(NPZ.resolve("arrays.json").toFile()).get("arrays");
        for (String file : List.of("arrays.npz", "arrays-compressed.npz")) {
            NpzArchive viaDirectory = NpzArchive.read(NPZ.resolve(file), 1 << 20);
            NpzArchive viaStream;
            try (InputStream in = Files.newInputStream(NPZ.resolve(file))) {
                viaStream = NpzArchive.read(in, file, 1 << 20);
            }
            for (NpzArchive a : List.of(viaDirectory, viaStream)) {
                assertEquals(expected.size(), a.size(), file);
                for (Map.Entry<String, JsonNode> e : expected.properties()) {
                    NpyArray arr = a.get(e.getKey());
                    JsonNode want = e.getValue();
                    assertEquals(want.get("dtype").asString(), arr.dtype(), e.getKey());
                    assertEquals(want.get("fortran_order").asBoolean(), arr.isFortranOrder(), e.getKey());
                    int[] shape = new int[want.get("shape").size()];
                    for (int i = 0; i < shape.length; i++) {
                        shape[i] = want.get("shape").get(i).asInt();
                    }
                    assertArrayEquals(shape, arr.shape(), e.getKey());
                    JsonNode values = want.get("values_row_major");
                    assertEquals(values.size(), arr.size(), e.getKey());
                    for (int i = 0; i < values.size(); i++) {
                        assertEquals(Double.doubleToLongBits(values.get(i).asDouble()),
                                Double.doubleToLongBits(arr.value(i)), file + " " + e.getKey() + "[" + i + "]");
                    }
                }
            }
        }
    }

    @Test
    void read_version2And3Headers_parsed() throws IOException {
        byte[] v2 = npy(2, "{'descr': '<f8', 'fortran_order': False, 'shape': (2,), }", le(8, 1.5, -2.0));
        NpyArray a = NpyFormat.read(new ByteArrayInputStream(v2), "v2", "t.npy", 1 << 20);
        assertArrayEquals(new double[] {1.5, -2.0}, a.values());
        byte[] v3 = npy(3, "{\"descr\": \"<f4\", \"fortran_order\": False, \"shape\": (1, 2)}", le4(0.5f, 3f));
        NpyArray b = NpyFormat.read(new ByteArrayInputStream(v3), "v3", "t.npy", 1 << 20);
        assertArrayEquals(new int[] {1, 2}, b.shape());
        assertArrayEquals(new double[] {0.5, 3.0}, b.values());
    }

    @Test
    void read_version3InvalidUtf8_errorNamesArray() {
        byte[] bad = npy(3, "{'descr': '<f8', 'fortran_order': False, 'shape': (), }", le(8, 1.0));
        int at = indexOf(bad, (byte) '}');
        bad[at + 1] = (byte) 0xC3;
        bad[at + 2] = (byte) 0x28;
        FormatException e = assertThrows(FormatException.class,
                () -> NpyFormat.read(new ByteArrayInputStream(bad), "weird", "t.npy", 1 << 20));
        assertTrue(e.getMessage().contains("array weird: the version 3.0 header is not valid UTF-8"), e.getMessage());
    }

    @Test
    void read_integerDtypesBothByteOrders_exactValues() throws IOException {
        ByteBuffer be4 = ByteBuffer.allocate(12).order(ByteOrder.BIG_ENDIAN).putInt(-7).putInt(65536).putInt(Integer.MAX_VALUE);
        assertArrayEquals(new double[] {-7, 65536, Integer.MAX_VALUE},
                read(">i4", "(3,)", be4.array()).values());
        ByteBuffer be2 = ByteBuffer.allocate(4).order(ByteOrder.BIG_ENDIAN).putShort((short) -2).putShort((short) 300);
        assertArrayEquals(new double[] {-2, 300}, read(">i2", "(2,)", be2.array()).values());
        ByteBuffer leu2 = ByteBuffer.allocate(4).order(ByteOrder.LITTLE_ENDIAN).putShort((short) -1).putShort((short) 5);
        assertArrayEquals(new double[] {65535, 5}, read("<u2", "(2,)", leu2.array()).values());
        ByteBuffer beu4 = ByteBuffer.allocate(4).order(ByteOrder.BIG_ENDIAN).putInt(-1);
        assertArrayEquals(new double[] {4294967295.0}, read(">u4", "(1,)", beu4.array()).values());
        ByteBuffer beu8 = ByteBuffer.allocate(16).order(ByteOrder.BIG_ENDIAN).putLong(1L << 53).putLong(-2048L);
        assertArrayEquals(new double[] {0x1p53, 18446744073709549568.0}, read(">u8", "(2,)", beu8.array()).values());
        ByteBuffer lei8 = ByteBuffer.allocate(8).order(ByteOrder.LITTLE_ENDIAN).putLong(-(1L << 40));
        assertArrayEquals(new double[] {-0x1p40}, read("<i8", "(1,)", lei8.array()).values());
        assertArrayEquals(new double[] {-1, 127}, read("|i1", "(2,)", new byte[] {-1, 127}).values());
        assertArrayEquals(new double[] {255, 0}, read("|u1", "(2,)", new byte[] {-1, 0}).values());
        assertArrayEquals(new double[] {1, 0}, read("|b1", "(2,)", new byte[] {1, 0}).values());
        ByteBuffer bef4 = ByteBuffer.allocate(4).order(ByteOrder.BIG_ENDIAN).putFloat(0.1f);
        assertArrayEquals(new double[] {0.1f}, read(">f4", "(1,)", bef4.array()).values());
    }

    @Test
    void read_int64NotExactlyADouble_errorNamesArrayAndIndex() {
        ByteBuffer b = ByteBuffer.allocate(16).order(ByteOrder.LITTLE_ENDIAN).putLong(1).putLong((1L << 53) + 1);
        FormatException e = assertThrows(FormatException.class, () -> read("<i8", "(2,)", b.array()));
        assertTrue(e.getMessage().contains("array a: value 1 (9007199254740993) cannot be held exactly by a double"),
                e.getMessage());
    }

    @Test
    void read_fortranOrder3d_rowMajorValues() throws IOException {
        int[] shape = {2, 3, 4};
        ByteBuffer b = ByteBuffer.allocate(8 * 24).order(ByteOrder.LITTLE_ENDIAN);
        // Fortran order: the first index varies fastest; the value names its index as 100i + 10j + k
        for (int k = 0; k < 4; k++) {
            for (int j = 0; j < 3; j++) {
                for (int i = 0; i < 2; i++) {
                    b.putDouble(100 * i + 10 * j + k);
                }
            }
        }
        byte[] f = npy(1, "{'descr': '<f8', 'fortran_order': True, 'shape': (2, 3, 4), }", b.array());
        NpyArray a = NpyFormat.read(new ByteArrayInputStream(f), "f3", "t.npy", 1 << 20);
        assertTrue(a.isFortranOrder());
        assertArrayEquals(shape, a.shape());
        int n = 0;
        for (int i = 0; i < 2; i++) {
            for (int j = 0; j < 3; j++) {
                for (int k = 0; k < 4; k++) {
                    assertEquals(100 * i + 10 * j + k, a.value(n++));
                }
            }
        }
    }

    @Test
    void read_zeroDimensionalAndEmpty_shapes() throws IOException {
        assertArrayEquals(new double[] {4.25}, read("<f8", "()", le(8, 4.25)).values());
        NpyArray empty = read("<f8", "(0, 3)", new byte[0]);
        assertEquals(0, empty.size());
        assertArrayEquals(new int[] {0, 3}, empty.shape());
    }

    @Test
    void read_malformedHeaders_errorsNameArrayAndProblem() {
        record Case(byte[] bytes, String fragment) {
        }
        byte[] ok = le(8, 1.0);
        byte[] badMagic = npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (1,), }", ok);
        badMagic[1] = 'X';
        byte[] badVersion = npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (1,), }", ok);
        badVersion[6] = 4;
        List<Case> cases = List.of(
                new Case(badMagic, "does not start with the NumPy magic string"),
                new Case(badVersion, "unsupported .npy format version 4.0"),
                new Case(npy(1, "{'descr': '<f8', 'shape': (1,), }", ok), "needs 'descr', 'fortran_order' and 'shape'"),
                new Case(npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (1,), 'x': 1}", ok), "unknown header key 'x'"),
                new Case(npy(1, "{'descr': [('a', '<f8')], 'fortran_order': False, 'shape': (1,), }", ok),
                        "structured dtypes"),
                new Case(npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (1), }", ok), "is not a tuple"),
                new Case(npy(1, "{'descr': '<f8', 'fortran_order': 0, 'shape': (1,), }", ok), "must be True or False"),
                new Case(npy(1, "{'descr': '<f2', 'fortran_order': False, 'shape': (1,), }", ok), "unsupported dtype '<f2'"),
                new Case(npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (2,), }", ok), "truncated"),
                new Case(npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (), }", le(8, 1, 2)),
                        "bytes after the 1 values"),
                new Case(npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (1000000, 1000000), }", ok),
                        "at most"));
        for (Case c : cases) {
            FormatException e = assertThrows(FormatException.class,
                    () -> NpyFormat.read(new ByteArrayInputStream(c.bytes()), "r1.weights", "p.npz", 1 << 20), c.fragment());
            assertTrue(e.getMessage().startsWith("p.npz: array r1.weights: "), e.getMessage());
            assertTrue(e.getMessage().contains(c.fragment()), e.getMessage() + "\n expected " + c.fragment());
        }
    }

    @Test
    void read_hugeShapeSmallEntry_refusedBeforeAllocating() throws IOException {
        byte[] lie = npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (200000000,), }", le(8, 1.0));
        Path p = tmp.resolve("lie.npz");
        Files.write(p, zip(true, Map.of("big.npy", lie)));
        FormatException e = assertThrows(FormatException.class, () -> NpzArchive.read(p, 1L << 40));
        assertTrue(e.getMessage().contains("array big: shape (200000000,) of <f8 needs 1600000000 bytes"), e.getMessage());
    }

    @Test
    void read_directoryClaimsFourGigabytes_allocationBoundedByWhatTheArchiveHolds() throws IOException {
        // 400,000,000 float64 values (3.2 GB) claimed by the header and a central directory that says the
        // entry holds 4 GB; the entry really holds one value. The values are read in growing chunks, so
        // the read fails after the one value without allocating for the claim.
        byte[] lie = npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (400000000,), }", le(8, 1.0));
        byte[] z = zip(true, Map.of("big.npy", lie));
        int cen = lastIndexOf(z, new byte[] {0x50, 0x4b, 0x01, 0x02});
        ByteBuffer.wrap(z).order(ByteOrder.LITTLE_ENDIAN).putInt(cen + 24, 0xfffffffe);
        Path p = tmp.resolve("claims-4gb.npz");
        Files.write(p, z);
        FormatException e = assertThrows(FormatException.class, () -> NpzArchive.read(p, 1L << 40));
        assertTrue(e.getMessage().startsWith(p + ": array big: the values end early: 1 of 400000000"), e.getMessage());
        FormatException s = assertThrows(FormatException.class,
                () -> NpzArchive.read(new ByteArrayInputStream(z), "-", 1L << 40));
        assertTrue(s.getMessage().startsWith("-: array big: the values end early"), s.getMessage());
    }

    @Test
    void read_trailingBytesAfterTheArchive_errorWithOffset() throws IOException {
        byte[] one = npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (), }", le(8, 1.0));
        byte[] z = zip(false, Map.of("w.npy", one));
        for (byte[] tail : new byte[][] {{0, 0, 0, 0}, "garbage".getBytes(StandardCharsets.US_ASCII)}) {
            byte[] bad = java.util.Arrays.copyOf(z, z.length + tail.length);
            System.arraycopy(tail, 0, bad, z.length, tail.length);
            Path p = tmp.resolve("trailing.npz");
            Files.write(p, bad);
            String expected = "unexpected " + tail.length + " bytes after the end of the zip archive at byte " + z.length;
            FormatException e = assertThrows(FormatException.class, () -> NpzArchive.read(p, 1 << 20));
            assertTrue(e.getMessage().startsWith(p + ": ") && e.getMessage().contains(expected), e.getMessage());
            FormatException s = assertThrows(FormatException.class,
                    () -> NpzArchive.read(new ByteArrayInputStream(bad), "-", 1 << 20));
            assertTrue(s.getMessage().startsWith("-: ") && s.getMessage().contains(expected), s.getMessage());
        }
        // the archive as written, and one with a zip comment, still read
        assertEquals(1.0, NpzArchive.read(new ByteArrayInputStream(z), "-", 1 << 20).get("w").value(0));
    }

    private static int lastIndexOf(byte[] a, byte[] sig) {
        for (int i = a.length - sig.length; i >= 0; i--) {
            if (java.util.Arrays.equals(a, i, i + sig.length, sig, 0, sig.length)) {
                return i;
            }
        }
        return -1;
    }

    @Test
    void read_entryNamesWithPaths_onlyKeysNoFilesWritten() throws IOException {
        byte[] one = npy(1, "{'descr': '<f8', 'fortran_order': False, 'shape': (), }", le(8, 1.0));
        Map<String, byte[]> entries = new java.util.LinkedHashMap<>();
        entries.put("../escaped.npy", one);
        entries.put("/absolute.npy", one);
        entries.put("dir/../../x.npy", one);
        Path dir = Files.createDirectory(tmp.resolve("inside"));
        Path p = dir.resolve("names.npz");
        Files.write(p, zip(false, entries));
        try (var before = Files.list(tmp)) {
            long count = before.count();
            NpzArchive a = NpzArchive.read(p, 1 << 20);
            assertEquals(List.of("../escaped", "/absolute", "dir/../../x"), a.names());
            assertEquals(1.0, a.get("../escaped").value(0));
            try (var after = Files.list(tmp)) {
                assertEquals(count, after.count());
            }
        }
        assertFalse(Files.exists(tmp.resolve("escaped.npy")));
        assertFalse(Files.exists(tmp.resolve("escaped")));
        assertFalse(Files.exists(Path.of("/absolute.npy")));
        try (InputStream in = Files.newInputStream(p)) {
            assertEquals(3, NpzArchive.read(in, "names.npz", 1 << 20).size());
        }
    }

    @Test
    void read_deflatedWithDataDescriptors_bothReadPaths() throws IOException {
        // java.util.zip.ZipOutputStream writes a data descriptor after every deflated entry (sizes unknown up front)
        byte[] arr = npy(1, "{'descr': '>f8', 'fortran_order': False, 'shape': (2,), }", be(1.25, -3.5));
        byte[] z = zip(true, Map.of("w.npy", arr));
        Path p = tmp.resolve("dd.npz");
        Files.write(p, z);
        assertArrayEquals(new double[] {1.25, -3.5}, NpzArchive.read(p, 1 << 20).get("w").values());
        assertArrayEquals(new double[] {1.25, -3.5}, NpzArchive.read(new ByteArrayInputStream(z), "dd.npz", 1 << 20)
                .get("w").values());
    }

    @Test
    void read_damagedEntries_errorsNameTheArray() throws IOException {
        // Source: fixtures/npz/arrays.npz (NumPy 1.24, stored) with one value byte flipped, and
        // arrays-compressed.npz with its deflated data overwritten.
        byte[] stored = Files.readAllBytes(NPZ.resolve("arrays.npz"));
        byte[] flipped = stored.clone();
        int at = indexOf(flipped, (byte) 0x93) + 128 + 3;
        flipped[at] ^= 0x40;
        Path p = tmp.resolve("flipped.npz");
        Files.write(p, flipped);
        FormatException e = assertThrows(FormatException.class, () -> NpzArchive.read(p, 1 << 20));
        assertTrue(e.getMessage().contains("array f8_c: the zip entry's CRC-32 does not match"), e.getMessage());
        FormatException s = assertThrows(FormatException.class,
                () -> NpzArchive.read(new ByteArrayInputStream(flipped), "flipped.npz", 1 << 20));
        assertTrue(s.getMessage().contains("array f8_c: cannot be read"), s.getMessage());
        byte[] deflated = Files.readAllBytes(NPZ.resolve("arrays-compressed.npz"));
        for (int i = 60; i < 90; i++) {
            deflated[i] = (byte) 0xff;
        }
        Path q = tmp.resolve("broken.npz");
        Files.write(q, deflated);
        FormatException d = assertThrows(FormatException.class, () -> NpzArchive.read(q, 1 << 20));
        assertTrue(d.getMessage().contains("array f8_c: "), d.getMessage());
    }

    @Test
    void read_notNpyEntryOrNotZip_errors() throws IOException {
        Path p = tmp.resolve("other.npz");
        Files.write(p, zip(false, Map.of("readme.txt", "hello".getBytes(StandardCharsets.US_ASCII))));
        FormatException e = assertThrows(FormatException.class, () -> NpzArchive.read(p, 1 << 20));
        assertTrue(e.getMessage().contains("the entry \"readme.txt\" is not an array"), e.getMessage());
        Path q = tmp.resolve("text.npz");
        Files.writeString(q, "not a zip");
        FormatException f = assertThrows(FormatException.class, () -> NpzArchive.read(q, 1 << 20));
        assertTrue(f.getMessage().contains("not an .npz archive"), f.getMessage());
        FormatException g = assertThrows(FormatException.class, () -> NpzArchive.read(tmp.resolve("none.npz"), 1 << 20));
        assertTrue(g.getMessage().contains("no such file"), g.getMessage());
    }

    @Test
    void write_thenRead_bitExactAndRepeatable() throws IOException {
        NpzArchive a = NpzArchive.of(List.of(
                NpyArray.ofDoubles("r0.weights", new int[] {2, 3}, new double[] {0.1, 0.2, 0.7, 5e-324, Math.PI, 1}),
                NpyArray.ofDoubles("r1.v0.mean", new int[] {2}, new double[] {-0.0, 3e300}),
                NpyArray.ofDoubles("s", new int[] {}, new double[] {2})));
        for (boolean compressed : new boolean[] {false, true}) {
            Path p = tmp.resolve("out" + compressed + ".npz");
            a.write(p, compressed);
            NpzArchive b = NpzArchive.read(p, 1 << 20);
            assertEquals(a.names(), b.names());
            for (NpyArray x : a.arrays()) {
                NpyArray y = b.get(x.name());
                assertArrayEquals(x.shape(), y.shape());
                for (int i = 0; i < x.size(); i++) {
                    assertEquals(Double.doubleToLongBits(x.value(i)), Double.doubleToLongBits(y.value(i)));
                }
            }
            ByteArrayOutputStream again = new ByteArrayOutputStream();
            a.write(again, compressed);
            assertArrayEquals(Files.readAllBytes(p), again.toByteArray());
        }
    }

    @Test
    void write_float64CArrays_sameBytesAsNumpy() throws IOException {
        // Source: the entries of fixtures/npz/arrays.npz as written by NumPy 1.24 (numpy.savez, stored).
        try (java.util.zip.ZipFile z = new java.util.zip.ZipFile(NPZ.resolve("arrays.npz").toFile())) {
            NpzArchive a = NpzArchive.read(NPZ.resolve("arrays.npz"), 1 << 20);
            for (String name : List.of("f8_c", "scalar", "f8_3d")) {
                byte[] numpy;
                try (InputStream in = z.getInputStream(z.getEntry(name + ".npy"))) {
                    numpy = in.readAllBytes();
                }
                ByteArrayOutputStream ours = new ByteArrayOutputStream();
                NpyFormat.write(a.get(name), ours);
                assertArrayEquals(numpy, ours.toByteArray(), name);
            }
        }
    }

    private NpyArray read(String descr, String shape, byte[] data) throws IOException {
        byte[] f = npy(1, "{'descr': '" + descr + "', 'fortran_order': False, 'shape': " + shape + ", }", data);
        return NpyFormat.read(new ByteArrayInputStream(f), "a", "t.npy", 1 << 20);
    }

    /** A hand-made .npy file: magic, version, header length, header padded to 64 bytes with a final newline, data. */
    static byte[] npy(int major, String dict, byte[] data) {
        int prefix = major == 1 ? 10 : 12;
        int total = (prefix + dict.length() + 1 + 63) / 64 * 64;
        StringBuilder h = new StringBuilder(dict);
        while (prefix + h.length() + 1 < total) {
            h.append(' ');
        }
        h.append('\n');
        byte[] hb = h.toString().getBytes(major == 3 ? StandardCharsets.UTF_8 : StandardCharsets.ISO_8859_1);
        ByteBuffer b = ByteBuffer.allocate(prefix + hb.length + data.length).order(ByteOrder.LITTLE_ENDIAN);
        b.put((byte) 0x93).put("NUMPY".getBytes(StandardCharsets.US_ASCII)).put((byte) major).put((byte) 0);
        if (major == 1) {
            b.putShort((short) hb.length);
        } else {
            b.putInt(hb.length);
        }
        return b.put(hb).put(data).array();
    }

    private static byte[] le(int size, double... v) {
        ByteBuffer b = ByteBuffer.allocate(size * v.length).order(ByteOrder.LITTLE_ENDIAN);
        for (double x : v) {
            b.putDouble(x);
        }
        return b.array();
    }

    private static byte[] be(double... v) {
        ByteBuffer b = ByteBuffer.allocate(8 * v.length).order(ByteOrder.BIG_ENDIAN);
        for (double x : v) {
            b.putDouble(x);
        }
        return b.array();
    }

    private static byte[] le4(float... v) {
        ByteBuffer b = ByteBuffer.allocate(4 * v.length).order(ByteOrder.LITTLE_ENDIAN);
        for (float x : v) {
            b.putFloat(x);
        }
        return b.array();
    }

    private static int indexOf(byte[] a, byte v) {
        for (int i = 0; i < a.length; i++) {
            if (a[i] == v) {
                return i;
            }
        }
        return -1;
    }

    private static byte[] zip(boolean deflate, Map<String, byte[]> entries) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (ZipOutputStream z = new ZipOutputStream(out)) {
            for (Map.Entry<String, byte[]> e : entries.entrySet()) {
                ZipEntry ze = new ZipEntry(e.getKey());
                if (!deflate) {
                    java.util.zip.CRC32 crc = new java.util.zip.CRC32();
                    crc.update(e.getValue());
                    ze.setMethod(ZipEntry.STORED);
                    ze.setSize(e.getValue().length);
                    ze.setCrc(crc.getValue());
                }
                z.putNextEntry(ze);
                z.write(e.getValue());
                z.closeEntry();
            }
        }
        return out.toByteArray();
    }
}
