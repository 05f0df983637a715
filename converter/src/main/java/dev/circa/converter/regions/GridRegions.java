package dev.circa.converter.regions;

import dev.circa.format.Provenance;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.regions.Partition;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import java.util.ArrayList;
import java.util.List;

/**
 * Grid region graphs for an H x W array of variables (an image, a sensor array): variables
 * {@code r<row>c<col>}, real, in row-major order. Each region, a rectangle of cells, splits its
 * longer side (the height on ties) at floor(length / 2) into two rectangles, down to single cells.
 * Regions are numbered breadth first from the root (region 0, the whole grid). Stateless.
 */
public final class GridRegions {
    private GridRegions() {
    }

    /** The variables {@code r<row>c<col>} of an H x W grid, real, row-major. */
    public static List<Variable> variables(int height, int width) {
        check(height, width);
        List<Variable> vars = new ArrayList<>(height * width);
        for (int r = 0; r < height; r++) {
            for (int c = 0; c < width; c++) {
                vars.add(Variable.of("r" + r + "c" + c, VariableType.REAL));
            }
        }
        return vars;
    }

    /** The grid region graph of an H x W grid. */
    public static RegionGraph generate(int height, int width) {
        List<Variable> vars = variables(height, width);
        List<Region> regions = new ArrayList<>();
        List<Partition> partitions = new ArrayList<>();
        List<int[]> rects = new ArrayList<>();
        rects.add(new int[] {0, 0, height, width});
        regions.add(new Region(0, cells(0, 0, height, width, width)));
        for (int head = 0; head < rects.size(); head++) {
            int[] q = rects.get(head);
            int row = q[0];
            int col = q[1];
            int h = q[2];
            int w = q[3];
            if (h == 1 && w == 1) {
                continue;
            }
            int[] a;
            int[] b;
            if (h >= w) {
                int top = h / 2;
                a = new int[] {row, col, top, w};
                b = new int[] {row + top, col, h - top, w};
            } else {
                int left = w / 2;
                a = new int[] {row, col, h, left};
                b = new int[] {row, col + left, h, w - left};
            }
            int ida = regions.size();
            rects.add(a);
            regions.add(new Region(ida, cells(a[0], a[1], a[2], a[3], width)));
            rects.add(b);
            regions.add(new Region(ida + 1, cells(b[0], b[1], b[2], b[3], width)));
            partitions.add(new Partition(head, new int[] {ida, ida + 1}));
        }
        return RegionGraph.builder().variables(vars).regions(regions).partitions(partitions)
                .provenance(new Provenance(null, null, "grid region graph: height " + height + ", width " + width))
                .build();
    }

    private static int[] cells(int row, int col, int h, int w, int width) {
        int[] v = new int[h * w];
        int k = 0;
        for (int r = row; r < row + h; r++) {
            for (int c = col; c < col + w; c++) {
                v[k++] = r * width + c;
            }
        }
        return v;
    }

    private static void check(int height, int width) {
        if (height < 1 || width < 1) {
            throw new IllegalArgumentException("grid height and width must be at least 1, got " + height + " x " + width);
        }
        if ((long) height * width > Integer.MAX_VALUE / 2) {
            throw new IllegalArgumentException("a grid of " + height + " x " + width + " is too large");
        }
    }
}
