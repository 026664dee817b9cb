package hammerstep.web;

import javax.crypto.SecretKeyFactory;
import javax.crypto.spec.PBEKeySpec;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.GeneralSecurityException;
import java.security.MessageDigest;
import java.security.SecureRandom;
import java.util.Base64;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The web view's accounts: a text file, one account a line,
 * {@code name:role:pbkdf2-sha256:ITERATIONS:SALT:HASH} (salt and hash in base64), blank lines and
 * {@code #} comments allowed. Passwords are never stored, only PBKDF2-HMAC-SHA256 of them with a
 * random salt per account ({@code hammerstep web-user} writes such a line). Immutable once read.
 */
public final class Accounts {

    static final String SCHEME = "pbkdf2-sha256";
    /** Iterations for new hashes: about 0.1 s on a Raspberry Pi 4 (estimate, not measured there). */
    static final int ITERATIONS = 100_000;
    private static final int MIN_ITERATIONS = 10_000;
    private static final int MAX_ITERATIONS = 10_000_000;
    private static final int HASH_BYTES = 32;

    /** A users file that cannot be used; the message names the line. */
    public static final class AccountsException extends Exception {
        AccountsException(String message) {
            super(message);
        }
    }

    private record Account(Role role, int iterations, byte[] salt, byte[] hash) { }

    private final Map<String, Account> byName;

    private Accounts(Map<String, Account> byName) {
        this.byName = byName;
    }

    public static Accounts read(Path file) throws AccountsException {
        List<String> lines;
        try {
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new AccountsException("cannot read " + file + ": " + e.getMessage());
        }
        Map<String, Account> accounts = new LinkedHashMap<>();
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i).strip();
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            String where = "line " + (i + 1) + ": ";
            String[] f = line.split(":", -1);
            if (f.length != 6) {
                throw new AccountsException(where + "expected name:role:" + SCHEME + ":iterations:salt:hash");
            }
            if (!f[0].matches("[A-Za-z0-9._-]{1,64}")) {
                throw new AccountsException(where + "account name must be 1 to 64 letters, digits, '.', '_' or '-'");
            }
            Role role = role(f[1]);
            if (role == null) {
                throw new AccountsException(where + "role '" + f[1] + "': expected viewer or engineer");
            }
            if (!f[2].equals(SCHEME)) {
                throw new AccountsException(where + "hash scheme '" + f[2] + "': expected " + SCHEME);
            }
            int iterations;
            byte[] salt;
            byte[] hash;
            try {
                iterations = Integer.parseInt(f[3]);
                salt = Base64.getDecoder().decode(f[4]);
                hash = Base64.getDecoder().decode(f[5]);
            } catch (IllegalArgumentException e) {
                throw new AccountsException(where + "iterations, salt or hash is malformed");
            }
            if (iterations < MIN_ITERATIONS || iterations > MAX_ITERATIONS) {
                throw new AccountsException(where + "iterations must be from " + MIN_ITERATIONS + " to " + MAX_ITERATIONS);
            }
            if (salt.length < 8 || hash.length != HASH_BYTES) {
                throw new AccountsException(where + "salt of at least 8 bytes and a hash of " + HASH_BYTES
                        + " bytes expected");
            }
            if (accounts.put(f[0], new Account(role, iterations, salt, hash)) != null) {
                throw new AccountsException(where + "account '" + f[0] + "' is listed twice");
            }
        }
        if (accounts.isEmpty()) {
            throw new AccountsException(file + " lists no account");
        }
        return new Accounts(Map.copyOf(accounts));
    }

    private static Role role(String s) {
        for (Role r : Role.values()) {
            if (r.label().equals(s)) {
                return r;
            }
        }
        return null;
    }

    /**
     * The account's role when {@code password} is its password, else null. An unknown name costs
     * the same hashing as a known one, so the answer's timing does not tell which names exist.
     */
    public Role check(String name, char[] password) {
        Account a = byName.get(name);
        Account probe = a != null ? a : new Account(Role.VIEWER, ITERATIONS, new byte[16], new byte[HASH_BYTES]);
        byte[] got = pbkdf2(password, probe.salt(), probe.iterations());
        boolean same = MessageDigest.isEqual(got, probe.hash());
        return a != null && same ? a.role() : null;
    }

    /** One line of a users file for {@code name} with {@code role} and {@code password}, with a fresh salt. */
    public static String line(String name, Role role, char[] password) {
        byte[] salt = new byte[16];
        new SecureRandom().nextBytes(salt);
        return line(name, role, password, salt, ITERATIONS);
    }

    static String line(String name, Role role, char[] password, byte[] salt, int iterations) {
        byte[] hash = pbkdf2(password, salt, iterations);
        Base64.Encoder b64 = Base64.getEncoder();
        return String.join(":", name, role.label(), SCHEME, Integer.toString(iterations), b64.encodeToString(salt),
                b64.encodeToString(hash));
    }

    private static byte[] pbkdf2(char[] password, byte[] salt, int iterations) {
        PBEKeySpec spec = new PBEKeySpec(password, salt, iterations, HASH_BYTES * 8);
        try {
            return SecretKeyFactory.getInstance("PBKDF2WithHmacSHA256").generateSecret(spec).getEncoded();
        } catch (GeneralSecurityException e) {
            throw new IllegalStateException("PBKDF2WithHmacSHA256 missing from this Java runtime", e);
        } finally {
            spec.clearPassword();
        }
    }

    /** Names of the accounts, for messages (never their hashes). */
    @Override
    public String toString() {
        return "accounts " + String.join(", ", byName.keySet().stream().sorted().toList());
    }
}
