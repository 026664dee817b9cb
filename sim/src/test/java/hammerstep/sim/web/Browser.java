package hammerstep.sim.web;

import org.openqa.selenium.OutputType;
import org.openqa.selenium.TakesScreenshot;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;

/**
 * Headless Chromium from Debian ({@code chromium}, {@code chromium-driver}), driven over WebDriver.
 * The browser and its driver are named explicitly, so Selenium Manager never looks for (or
 * downloads) either; when they are missing the browser tests fail and say what to install.
 */
final class Browser {

    static final Path CHROMIUM = Path.of(System.getProperty("hammerstep.chromium", "/usr/bin/chromium"));
    static final Path CHROMEDRIVER = Path.of(System.getProperty("hammerstep.chromedriver", "/usr/bin/chromedriver"));
    /** Where the tests leave their screenshots (the module's target/). */
    static final Path SCREENSHOTS = Path.of("target", "screenshots");

    private Browser() {
    }

    /** Why the browser tests cannot run here, or null. */
    static String missing() {
        if (!Files.isExecutable(CHROMIUM) || !Files.isExecutable(CHROMEDRIVER)) {
            return "the browser tests need Debian's chromium and chromium-driver (" + CHROMIUM + ", " + CHROMEDRIVER
                    + "): apt-get install -y chromium chromium-driver (.ci/run does)";
        }
        return null;
    }

    /** A headless Chromium with a window the size of a plant laptop's screen. */
    static ChromeDriver start() {
        System.setProperty("webdriver.chrome.driver", CHROMEDRIVER.toString());
        ChromeDriverService service = new ChromeDriverService.Builder()
                .usingDriverExecutable(CHROMEDRIVER.toFile())
                .usingAnyFreePort()
                .withLogFile(new File("target/chromedriver.log"))
                .build();
        ChromeOptions options = new ChromeOptions();
        options.setBinary(CHROMIUM.toFile());
        options.addArguments("--headless=new", "--no-sandbox", "--disable-dev-shm-usage", "--disable-gpu",
                "--window-size=1280,1000", "--no-first-run", "--disable-extensions", "--disable-background-networking",
                "--disable-component-update", "--disable-sync", "--metrics-recording-only", "--mute-audio");
        ChromeDriver driver = new ChromeDriver(service, options);
        driver.manage().timeouts().pageLoadTimeout(Duration.ofSeconds(30));
        return driver;
    }

    /** Saves what the browser shows as target/screenshots/{@code name}.png. */
    static Path screenshot(ChromeDriver driver, String name) throws IOException {
        Files.createDirectories(SCREENSHOTS);
        Path file = SCREENSHOTS.resolve(name + ".png");
        Files.write(file, ((TakesScreenshot) driver).getScreenshotAs(OutputType.BYTES));
        return file;
    }
}
