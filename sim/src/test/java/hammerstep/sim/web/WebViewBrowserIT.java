package hammerstep.sim.web;

import hammerstep.app.Main;
import hammerstep.sim.demo.DemoOptions;
import hammerstep.sim.demo.DemoRunner;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.MethodOrderer;
import org.junit.jupiter.api.Order;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.TestMethodOrder;
import org.openqa.selenium.By;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.support.ui.Select;
import org.openqa.selenium.support.ui.WebDriverWait;

import java.io.ByteArrayOutputStream;
import java.io.OutputStream;
import java.io.PrintStream;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.fail;

/**
 * The web view in a real browser (headless Chromium) against the simulated station of
 * config/demo: the demo runs two parts in virtual time paced to the wall clock (so a rundown takes
 * as long on the page as on the fixture), delivering its results through the embedded broker to a
 * results file, and keeps serving afterwards. The live page is watched while the parts run; the
 * results, a joint, a part and the capability page after them. Screenshots of every page go to
 * sim/target/screenshots/.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
@TestMethodOrder(MethodOrderer.OrderAnnotation.class)
class WebViewBrowserIT {

    private static final Path STATION = Path.of("../config/demo/station.yaml");
    private static final Duration PARTS_LIMIT = Duration.ofMinutes(6);

    private Path dir;
    private Path results;
    private DemoRunner runner;
    private Thread demo;
    private final AtomicInteger exit = new AtomicInteger(-1);
    private final CountDownLatch serving = new CountDownLatch(1);
    private final CountDownLatch partsDone = new CountDownLatch(1);
    private final ByteArrayOutputStream printed = new ByteArrayOutputStream();
    private int port;
    private ChromeDriver browser;

    @BeforeAll
    void demoStationServingItsViewAndABrowser() throws Exception {
        String missing = Browser.missing();
        if (missing != null) {
            fail(missing);
        }
        dir = Files.createTempDirectory("hammerstep-browser");
        results = dir.resolve("results.jsonl");
        try (ServerSocket free = new ServerSocket(0)) {
            port = free.getLocalPort();
        }
        OutputStream watched = new OutputStream() {
            @Override
            public synchronized void write(int b) {
                printed.write(b);
                if (b == '\n') {
                    String text = printed.toString(StandardCharsets.UTF_8);
                    if (text.contains("web view: http://")) {
                        serving.countDown();
                    }
                    if (text.contains("parts done")) {
                        partsDone.countDown();
                    }
                }
            }
        };
        DemoOptions options = new DemoOptions(STATION, 2, 3, false, true, 0, Files.createDirectories(dir.resolve("traces")),
                true, null, results, null, null);
        runner = new DemoRunner(options, new PrintStream(watched, true, StandardCharsets.UTF_8), port);
        demo = new Thread(() -> {
            try {
                exit.set(runner.run());
            } catch (Exception e) {
                e.printStackTrace();
                exit.set(99);
            }
        }, "demo");
        demo.setDaemon(true);
        demo.start();
        assertThat(serving.await(120, TimeUnit.SECONDS)).as("the demo serves its view: %s", printed()).isTrue();
        browser = Browser.start();
    }

    @AfterAll
    void stop() throws Exception {
        if (browser != null) {
            browser.quit();
        }
        if (runner != null) {
            runner.stopServing();
            demo.join(60_000);
        }
    }

    private String printed() {
        synchronized (printed) {
            return printed.toString(StandardCharsets.UTF_8);
        }
    }

    private String url(String path) {
        return "http://127.0.0.1:" + port + path;
    }

    private WebDriverWait waitUpTo(Duration d) {
        WebDriverWait wait = new WebDriverWait(browser, d, Duration.ofMillis(50));
        wait.ignoring(org.openqa.selenium.StaleElementReferenceException.class);
        return wait;
    }

    private void awaitParts() throws InterruptedException {
        assertThat(partsDone.await(PARTS_LIMIT.toSeconds(), TimeUnit.SECONDS)).as("the demo's parts: %s", printed())
                .isTrue();
    }

    /** Points of the live curve now, read in one script call (the page redraws it on every update). */
    private int curvePoints() {
        Object pts = browser.executeScript(
                "var c = document.querySelector('#trace polyline.curve'); return c ? c.getAttribute('points') : '';");
        String s = pts == null ? "" : pts.toString().strip();
        return s.isEmpty() ? 0 : s.split("\\s+").length;
    }

    @Test
    @Order(1)
    void theLivePageShowsTheLampsAndARundownsTraceAsItHappens() throws Exception {
        browser.get(url("/"));
        WebDriverWait wait = waitUpTo(Duration.ofSeconds(60));
        wait.until(d -> d.findElement(By.id("link")).getText().equals("live"));
        // the tower: the station lights a lamp for the operator at once (white ready or blue act)
        wait.until(d -> !d.findElements(By.cssSelector("#tower .lamp.on, #tower .lamp.blink")).isEmpty());
        assertThat(browser.findElements(By.cssSelector("#tower .lamp"))).hasSize(5);
        // a part in the fixture: its positions' lamps, one per bolt of its pattern
        wait.until(d -> d.findElement(By.id("part")).getText().startsWith("PS40"));
        assertThat(browser.findElements(By.cssSelector("#positions .lamp.pos")).size()).isIn(4, 8);
        assertThat(browser.findElement(By.id("pattern")).getText()).isNotBlank();

        // a rundown under way, drawn as it happens: caught while running and seen to grow
        WebDriverWait rundown = waitUpTo(Duration.ofSeconds(120));
        rundown.until(d -> d.findElement(By.id("rundown")).getText().startsWith("under way") && curvePoints() >= 10);
        int early = curvePoints();
        assertThat(browser.findElement(By.id("tool")).getText()).isIn("enabled", "disabled"); // off at shut-off
        Browser.screenshot(browser, "live-rundown");
        rundown.until(d -> curvePoints() > early);
        // ... and once it ends, the joint in the list of last joints with its verdict, and its blows marked
        rundown.until(d -> !d.findElements(By.cssSelector("#joints tr")).isEmpty());
        assertThat(browser.executeScript("return document.querySelector('#joints tr td:nth-child(8)').textContent;"))
                .isIn("GO", "NO_GO");
        rundown.until(d -> d.findElement(By.id("rundown")).getText().matches("(under way|last), [0-9]+ blows")
                && !d.findElements(By.cssSelector("#trace circle.peak")).isEmpty());
        assertThat(browser.findElement(By.id("transducer")).getText()).startsWith("healthy");
        Browser.screenshot(browser, "live");
    }

    @Test
    @Order(2)
    void theResultsTableFilters() throws Exception {
        awaitParts();
        browser.get(url("/results"));
        int all = matching();
        assertThat(all).isGreaterThanOrEqualTo(12); // 8 + 4 positions, reworks on top
        Set<String> positions = new HashSet<>(column(3));
        assertThat(positions).hasSizeGreaterThanOrEqualTo(8);
        Browser.screenshot(browser, "results");

        browser.findElement(By.name("position")).sendKeys("D3");
        browser.findElement(By.cssSelector("form.filter button")).click();
        waitUpTo(Duration.ofSeconds(10)).until(d -> d.getCurrentUrl().contains("position=D3"));
        int d3 = matching();
        assertThat(d3).isBetween(1, all - 1);
        assertThat(column(3)).hasSize(d3).containsOnly("D3");

        // by part serial: the second part's joints only, all of its pattern's positions
        browser.get(url("/results"));
        List<String> serials = column(2);
        String suction = serials.stream().filter(s -> s.startsWith("PS40S")).findFirst().orElseThrow();
        browser.findElement(By.name("serial")).sendKeys(suction);
        browser.findElement(By.cssSelector("form.filter button")).click();
        waitUpTo(Duration.ofSeconds(10)).until(d -> d.getCurrentUrl().contains("serial="));
        assertThat(column(2)).isNotEmpty().containsOnly(suction);

        // by verdict
        browser.get(url("/results"));
        new Select(browser.findElement(By.name("verdict"))).selectByValue("GO");
        browser.findElement(By.cssSelector("form.filter button")).click();
        waitUpTo(Duration.ofSeconds(10)).until(d -> d.getCurrentUrl().contains("verdict=GO"));
        assertThat(column(9)).isNotEmpty().containsOnly("GO");
        Browser.screenshot(browser, "results-filtered");
    }

    @Test
    @Order(3)
    void aJointOpensItsTraceAndAPartItsPattern() throws Exception {
        awaitParts();
        browser.get(url("/results"));
        // the joint with the most blows on the first page: the fullest picture
        List<WebElement> cells = null;
        for (WebElement tr : browser.findElements(By.cssSelector("table.joints tbody tr"))) {
            List<WebElement> c = tr.findElements(By.tagName("td"));
            if (cells == null || Integer.parseInt(c.get(8).getText()) > Integer.parseInt(cells.get(8).getText())) {
                cells = c;
            }
        }
        String seq = cells.get(0).getText();
        int blows = Integer.parseInt(cells.get(8).getText());
        String verdict = cells.get(9).getText();
        cells.get(0).findElement(By.tagName("a")).click();
        waitUpTo(Duration.ofSeconds(10)).until(d -> d.getTitle().startsWith("Joint " + seq));
        assertThat(browser.findElement(By.cssSelector("main h2")).getText()).startsWith(verdict);
        // the stored trace, drawn: the torque curve, every blow's peak, the window, target and shut-off
        WebElement curve = browser.findElement(By.cssSelector("figure svg polyline.curve"));
        assertThat(curve.getAttribute("points").strip().split("\\s+").length).isGreaterThan(100);
        assertThat(browser.findElements(By.cssSelector("figure svg circle.peak"))).hasSize(blows);
        assertThat(browser.findElements(By.cssSelector("figure svg rect.window"))).hasSize(1);
        assertThat(browser.findElements(By.cssSelector("figure svg line.target"))).isNotEmpty();
        assertThat(browser.findElements(By.cssSelector("figure figcaption"))).as("no note: the stored trace is drawn")
                .isEmpty();
        assertThat(browser.findElement(By.cssSelector("table.fields")).getText()).contains("final torque")
                .contains("blows " + blows);
        Browser.screenshot(browser, "joint");

        browser.get(url("/results"));
        browser.findElement(By.cssSelector("table.joints tbody tr td:nth-child(3) a")).click();
        waitUpTo(Duration.ofSeconds(10)).until(d -> d.getCurrentUrl().contains("/part?serial="));
        assertThat(browser.getPageSource()).contains("PS40");
        Browser.screenshot(browser, "part");
    }

    @Test
    @Order(4)
    void theCapabilityFiguresAreThoseOfStatsOnTheSameResults() throws Exception {
        awaitParts();
        browser.get(url("/capability"));
        List<List<String>> page = new ArrayList<>();
        for (WebElement tr : browser.findElements(By.cssSelector("table.cap tbody tr"))) {
            List<String> row = new ArrayList<>();
            for (WebElement td : tr.findElements(By.tagName("td"))) {
                row.add(td.getText().replace("∞", "inf"));
            }
            row.set(11, row.get(11).isEmpty() ? "-" : row.get(11).replace(' ', ','));
            page.add(row);
        }
        Browser.screenshot(browser, "capability");

        List<List<String>> stats = new ArrayList<>();
        String table = stats(results);
        for (String line : table.split("\n")) {
            String[] f = line.strip().split("\\s+");
            if (f.length == 12 && f[2].matches("[0-9]+")) {
                stats.add(List.of(f));
            }
        }
        assertThat(stats).as("stats on the delivered results:\n%s", table).isNotEmpty();
        assertThat(page).as("the capability page, row by row, against stats:\n%s", table)
                .containsExactlyElementsOf(stats);
        Matcher joints = Pattern.compile("([0-9]+) joints").matcher(table);
        assertThat(joints.find()).isTrue();
        assertThat(browser.findElement(By.tagName("main")).getText()).contains(joints.group(1) + " joints. Cm =");
    }

    /** {@code hammerstep stats FILE}, its table as printed. */
    private static synchronized String stats(Path file) {
        PrintStream saved = System.out;
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try (PrintStream capture = new PrintStream(bytes, true, StandardCharsets.UTF_8)) {
            System.setOut(capture);
            assertThat(Main.run("stats", file.toString())).isZero();
        } finally {
            System.setOut(saved);
        }
        return bytes.toString(StandardCharsets.UTF_8);
    }

    private int matching() {
        Matcher m = Pattern.compile("([0-9]+) joints match").matcher(browser.findElement(By.tagName("main")).getText());
        assertThat(m.find()).isTrue();
        return Integer.parseInt(m.group(1));
    }

    /** The cells of one column (0-based) of the results table on this page. */
    private List<String> column(int index) {
        List<String> out = new ArrayList<>();
        for (WebElement tr : browser.findElements(By.cssSelector("table.joints tbody tr"))) {
            out.add(tr.findElements(By.tagName("td")).get(index).getText());
        }
        return out;
    }
}
