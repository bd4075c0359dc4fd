package dev.erg.calibrate;

import java.util.ArrayList;
import java.util.Collection;
import java.util.Comparator;
import java.util.List;

/** Closest-name suggestions for misspelt node names. */
final class Names {
    private Names() {
    }

    /**
     * Up to {@code limit} names of {@code names} closest to {@code wanted} by edit distance
     * (ties by name), keeping only those within half the wanted name's length.
     */
    static List<String> closest(String wanted, Collection<String> names, int limit) {
        record Scored(String name, int distance) {
        }
        List<Scored> scored = new ArrayList<>();
        int max = Math.max(2, wanted.length() / 2);
        for (String n : names) {
            // Cheap bound first: the distance is at least the length difference.
            if (Math.abs(n.length() - wanted.length()) > max) {
                continue;
            }
            int d = distance(wanted, n);
            if (d <= max) {
                scored.add(new Scored(n, d));
            }
        }
        scored.sort(Comparator.comparingInt(Scored::distance).thenComparing(Scored::name));
        List<String> out = new ArrayList<>();
        for (int i = 0; i < scored.size() && i < limit; i++) {
            out.add(scored.get(i).name());
        }
        return out;
    }

    /** Levenshtein distance (insert, delete, substitute, each 1). */
    static int distance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            prev[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            cur[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int sub = prev[j - 1] + (a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1);
                cur[j] = Math.min(sub, Math.min(prev[j] + 1, cur[j - 1] + 1));
            }
            int[] t = prev;
            prev = cur;
            cur = t;
        }
        return prev[b.length()];
    }
}
