package hammerstep.plot;

import de.erichseifert.vectorgraphics2d.Document;
import de.erichseifert.vectorgraphics2d.Processors;
import de.erichseifert.vectorgraphics2d.VectorGraphics2D;
import de.erichseifert.vectorgraphics2d.util.PageSize;
import org.knowm.xchart.internal.chartpart.Chart;

import javax.imageio.ImageIO;
import java.awt.Color;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.image.BufferedImage;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;

/**
 * Writes charts stacked top to bottom into one PNG or SVG file. Runs without a display: the AWT
 * headless property is set before any chart is built (see {@link #headless()}).
 */
public final class Picture {

    static {
        System.setProperty("java.awt.headless", "true");
    }

    /** The picture formats, told apart by the file name's ending. */
    public enum Format { PNG, SVG }

    private Picture() {
    }

    /** Makes sure AWT runs headless; call before building a chart. */
    public static void headless() {
        // the static initialiser has set the property once this class is loaded
    }

    /** The format for a file name, or null when it ends in neither .png nor .svg. */
    public static Format formatOf(Path file) {
        String name = file.getFileName().toString().toLowerCase(Locale.ROOT);
        if (name.endsWith(".png")) {
            return Format.PNG;
        }
        if (name.endsWith(".svg")) {
            return Format.SVG;
        }
        return null;
    }

    /**
     * Paints {@code charts} one below the other, each {@code width} × {@code height} pixels, into
     * {@code file}. Failures are IOExceptions with a message of ours, never the chart library's: a
     * file that cannot be written says why, values the library cannot draw say so.
     */
    public static void write(List<? extends Chart<?, ?>> charts, int width, int height, Path file) throws IOException {
        try {
            render(charts, width, height, file);
        } catch (java.nio.file.NoSuchFileException e) {
            throw new IOException(file + ": cannot write it: no such directory, or new files cannot be made there");
        } catch (java.nio.file.AccessDeniedException e) {
            throw new IOException(file + ": cannot write it: permission denied");
        } catch (java.nio.file.FileSystemException e) {
            throw new IOException(file + ": cannot write it" + (e.getReason() == null ? "" : ": " + e.getReason()));
        } catch (IOException e) {
            throw new IOException(file + ": cannot write it" + (e.getMessage() == null ? "" : ": " + e.getMessage()));
        } catch (RuntimeException e) {
            // the chart library refuses values it cannot scale (infinite, out of its number range)
            throw new IOException(file + ": cannot draw these values (infinite or out of the chart's range)");
        }
    }

    private static void render(List<? extends Chart<?, ?>> charts, int width, int height, Path file) throws IOException {
        Format format = formatOf(file);
        if (format == null) {
            throw new IllegalArgumentException(file + ": the picture's name must end in .png or .svg");
        }
        int total = height * charts.size();
        Path parent = file.toAbsolutePath().getParent();
        if (parent != null) {
            Files.createDirectories(parent);
        }
        if (format == Format.PNG) {
            BufferedImage image = new BufferedImage(width, total, BufferedImage.TYPE_INT_RGB);
            Graphics2D g = image.createGraphics();
            g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
            g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
            g.setColor(Color.WHITE);
            g.fillRect(0, 0, width, total);
            paint(charts, width, height, g);
            g.dispose();
            try (OutputStream out = Files.newOutputStream(file)) {
                if (!ImageIO.write(image, "png", out)) {
                    throw new IOException("no PNG writer available");
                }
            }
        } else {
            VectorGraphics2D g = new VectorGraphics2D();
            paint(charts, width, height, g);
            Document doc = Processors.get("svg").getDocument(g.getCommands(), new PageSize(0, 0, width, total));
            try (OutputStream out = Files.newOutputStream(file)) {
                doc.writeTo(out);
            }
        }
    }

    private static void paint(List<? extends Chart<?, ?>> charts, int width, int height, Graphics2D g) {
        for (int i = 0; i < charts.size(); i++) {
            Graphics2D part = (Graphics2D) g.create(0, i * height, width, height);
            charts.get(i).paint(part, width, height);
            part.dispose();
        }
    }
}
