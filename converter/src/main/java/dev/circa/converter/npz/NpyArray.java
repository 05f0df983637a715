package dev.circa.converter.npz;

import java.util.Arrays;

/**
 * One NumPy array as read from a {@code .npy} file or an {@code .npz} entry: its name, the dtype
 * as written ({@code descr}, e.g. {@code "<f8"}), its shape, whether the file stored it in Fortran
 * order, and its values as doubles in row-major (C) order whatever the file's order.
 *
 * <p>Immutable; {@link #values()} and {@link #shape()} return copies, {@link #value(int)} does not copy.
 */
public final class NpyArray {
    private final String name;
    private final String dtype;
    private final int[] shape;
    private final boolean fortranOrder;
    private final double[] values;

    /**
     * @param name the array's name (an archive key), not a path
     * @param dtype the dtype as written, e.g. {@code "<f8"}
     * @param shape the shape (empty for a 0-d array)
     * @param fortranOrder whether the source stored it in Fortran order
     * @param values the values in row-major order, as many as the shape's product
     */
    public NpyArray(String name, String dtype, int[] shape, boolean fortranOrder, double[] values) {
        long size = 1;
        for (int d : shape) {
            if (d < 0) {
                throw new IllegalArgumentException("array " + name + ": negative dimension " + d);
            }
            size *= d;
        }
        if (size != values.length) {
            throw new IllegalArgumentException("array " + name + ": shape " + shapeText(shape) + " needs " + size
                    + " values, got " + values.length);
        }
        this.name = name;
        this.dtype = dtype;
        this.shape = shape.clone();
        this.fortranOrder = fortranOrder;
        this.values = values;
    }

    /** A float64 array in C order (what the writers produce). {@code values} is not copied. */
    public static NpyArray ofDoubles(String name, int[] shape, double[] values) {
        return new NpyArray(name, "<f8", shape, false, values);
    }

    /** The name: the archive key (entry name without {@code .npy}), never used as a file path. */
    public String name() {
        return name;
    }

    /** The dtype as written in the header, e.g. {@code "<f8"}, {@code ">i4"}, {@code "|u1"}. */
    public String dtype() {
        return dtype;
    }

    /** A copy of the shape (empty for a 0-d array). */
    public int[] shape() {
        return shape.clone();
    }

    /** Number of dimensions. */
    public int rank() {
        return shape.length;
    }

    /** Length of dimension {@code axis}. */
    public int dim(int axis) {
        return shape[axis];
    }

    /** Whether the file stored the values in Fortran (column-major) order. */
    public boolean isFortranOrder() {
        return fortranOrder;
    }

    /** Number of values. */
    public int size() {
        return values.length;
    }

    /** A copy of the values in row-major order. */
    public double[] values() {
        return values.clone();
    }

    /** Value {@code i} in row-major order. */
    public double value(int i) {
        return values[i];
    }

    /** The shape as NumPy prints it, e.g. {@code (2, 3)}, {@code (3,)} or {@code ()}. */
    public String shapeText() {
        return shapeText(shape);
    }

    /** {@code shape} as NumPy prints it. */
    public static String shapeText(int[] shape) {
        if (shape.length == 1) {
            return "(" + shape[0] + ",)";
        }
        StringBuilder sb = new StringBuilder("(");
        for (int i = 0; i < shape.length; i++) {
            if (i > 0) {
                sb.append(", ");
            }
            sb.append(shape[i]);
        }
        return sb.append(')').toString();
    }

    @Override
    public String toString() {
        return name + " " + dtype + " " + shapeText() + (fortranOrder ? " fortran" : "") + " "
                + Arrays.toString(values.length > 8 ? Arrays.copyOf(values, 8) : values);
    }
}
