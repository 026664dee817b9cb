package hammerstep.web;

import hammerstep.results.JointOutcome;
import hammerstep.web.ResultLog.JointRow;

import java.time.Instant;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * What the results table shows: every criterion optional, all of them must hold. Read from a page's
 * query ({@link #of}); an empty or missing field does not filter.
 *
 * @param from     joints judged at or after this time (UTC), or null
 * @param to       joints judged before this time (UTC), or null
 * @param serial   the part serial, exactly, or ""
 * @param program  the program id, or ""
 * @param position the position label, or ""
 * @param pass     the pass name, or ""
 * @param verdict  GO or NO_GO, or ""
 * @param reason   a reason code the joint carries, or ""
 * @param page     0-based page of {@code pageSize} rows, newest first
 */
public record JointFilter(Instant from, Instant to, String serial, String program, String position, String pass,
                          String verdict, String reason, int page, int pageSize) {

    public static final int PAGE_SIZE = 50;
    static final List<String> KEYS = List.of("from", "to", "serial", "program", "position", "pass", "verdict",
            "reason", "page");

    /** A query value the view cannot take. */
    public static final class BadQuery extends Exception {
        BadQuery(String message) {
            super(message);
        }
    }

    /** No criterion: every joint, first page. */
    public static JointFilter all() {
        return new JointFilter(null, null, "", "", "", "", "", "", 0, PAGE_SIZE);
    }

    /** Reads a query; times as {@code 2026-03-02T06:15} or with seconds, UTC. */
    public static JointFilter of(Map<String, String> q) throws BadQuery {
        String verdict = q.getOrDefault("verdict", "").strip().toUpperCase(Locale.ROOT);
        if (!verdict.isEmpty() && !verdict.equals("GO") && !verdict.equals("NO_GO")) {
            throw new BadQuery("verdict must be GO or NO_GO, got " + verdict);
        }
        int page;
        try {
            String p = q.getOrDefault("page", "").strip();
            page = p.isEmpty() ? 0 : Integer.parseInt(p);
        } catch (NumberFormatException e) {
            throw new BadQuery("page must be a whole number, got " + q.get("page"));
        }
        if (page < 0 || page > 1_000_000) {
            throw new BadQuery("page must be from 0 to 1000000, got " + page);
        }
        return new JointFilter(time(q, "from"), time(q, "to"), field(q, "serial"), field(q, "program"),
                field(q, "position"), field(q, "pass"), verdict, field(q, "reason").toUpperCase(Locale.ROOT), page,
                PAGE_SIZE);
    }

    private static String field(Map<String, String> q, String key) {
        String v = q.getOrDefault(key, "").strip();
        return v.length() > 200 ? v.substring(0, 200) : v;
    }

    private static Instant time(Map<String, String> q, String key) throws BadQuery {
        String v = q.getOrDefault(key, "").strip();
        if (v.isEmpty()) {
            return null;
        }
        try {
            if (v.endsWith("Z")) {
                return Instant.parse(v);
            }
            return LocalDateTime.parse(v).toInstant(ZoneOffset.UTC);
        } catch (DateTimeParseException e) {
            throw new BadQuery(key + " must be a time like 2026-03-02T06:15 (UTC), got " + cut(v));
        }
    }

    private static String cut(String v) {
        return v.length() > 40 ? v.substring(0, 40) + "..." : v;
    }

    /** True when the joint meets every criterion. */
    public boolean matches(JointRow row) {
        JointOutcome j = row.joint();
        if (from != null && j.at().isBefore(from)) {
            return false;
        }
        if (to != null && !j.at().isBefore(to)) {
            return false;
        }
        return (serial.isEmpty() || serial.equals(j.partSerial()))
                && (program.isEmpty() || program.equals(j.result().program().id()))
                && (position.isEmpty() || position.equals(j.position()))
                && (pass.isEmpty() || pass.equals(j.pass()))
                && (verdict.isEmpty() || verdict.equals(j.result().verdict().name()))
                && (reason.isEmpty() || j.result().reasons().stream().anyMatch(r -> r.name().equals(reason)));
    }

    /** Every matching joint, newest first. */
    public List<JointRow> apply(List<JointRow> oldestFirst) {
        List<JointRow> out = new ArrayList<>();
        for (int i = oldestFirst.size() - 1; i >= 0; i--) {
            if (matches(oldestFirst.get(i))) {
                out.add(oldestFirst.get(i));
            }
        }
        return out;
    }

    /** This filter's page of {@code matching}. */
    public List<JointRow> page(List<JointRow> matching) {
        int a = (int) Math.min(matching.size(), (long) page * pageSize);
        int b = Math.min(matching.size(), a + pageSize);
        return matching.subList(a, b);
    }

    /** The same criteria on another page. */
    public JointFilter onPage(int p) {
        return new JointFilter(from, to, serial, program, position, pass, verdict, reason, p, pageSize);
    }

    /** The criteria as a query string (without the page), for links. */
    public String query() {
        StringBuilder b = new StringBuilder();
        add(b, "from", from == null ? "" : LocalDateTime.ofInstant(from, ZoneOffset.UTC).toString());
        add(b, "to", to == null ? "" : LocalDateTime.ofInstant(to, ZoneOffset.UTC).toString());
        add(b, "serial", serial);
        add(b, "program", program);
        add(b, "position", position);
        add(b, "pass", pass);
        add(b, "verdict", verdict);
        add(b, "reason", reason);
        return b.toString();
    }

    private static void add(StringBuilder b, String key, String value) {
        if (value.isEmpty()) {
            return;
        }
        if (b.length() > 0) {
            b.append('&');
        }
        b.append(key).append('=').append(java.net.URLEncoder.encode(value, java.nio.charset.StandardCharsets.UTF_8));
    }
}
