# Reference values for the appendix tests (internal/layout/appendix_test.go),
# computed with R 4.2.2 from the demo scenario's files, independently of
# peerpack. Write the demo files first, then run from the repository root:
#
#   go run ./cmd/peerpack new --template client-report /tmp/appendix-ref
#   Rscript testdata/layout/appendix_reference.R /tmp/appendix-ref > testdata/layout/appendix_reference.csv
#
# The demo scenario is invented (fixed seed); rerun this when its generator
# changes and review the diff.
args <- commandArgs(trailingOnly = TRUE)
dir <- if (length(args) > 0) args[1] else "."
reg <- read.csv(file.path(dir, "institutions.csv"), stringsAsFactors = FALSE)
long <- read.csv(file.path(dir, "values.csv"), stringsAsFactors = FALSE, na.strings = c("", "n/a"))
wide <- read.csv(file.path(dir, "values-wide.csv"), stringsAsFactors = FALSE)
ppp <- read.csv(file.path(dir, "ppp.csv"), stringsAsFactors = FALSE)

# Field-normalised citation impact is computed from the paper records, as
# the briefs ask (data.papers, three-year windows): each paper's citations
# over the weighted mean of its field, year and type (a paper in k fields
# counts 1/k in each), the mean of its fields' ratios, then the mean over an
# institution's papers (Waltman et al. 2011).
pp <- read.csv(file.path(dir, "papers.csv"), stringsAsFactors = FALSE)
fl <- strsplit(pp$field, ";")
k <- lengths(fl)
pf <- data.frame(pid = rep(seq_len(nrow(pp)), k), field = unlist(fl), year = rep(pp$year, k),
                 type = rep(pp$type, k), cit = rep(pp$citations, k), w = rep(1 / k, k))
gk <- paste(pf$field, pf$year, pf$type)
expected <- (tapply(pf$w * pf$cit, gk, sum) / tapply(pf$w, gk, sum))[gk]
pf$ratio <- ifelse(expected > 0, pf$cit / expected, NA)
score <- tapply(pf$ratio, pf$pid, function(x) if (all(is.na(x))) NA else mean(x, na.rm = TRUE))
ins <- strsplit(pp$institutions, ";")
ai <- unique(data.frame(pid = rep(seq_len(nrow(pp)), lengths(ins)), inst = unlist(ins)))
ai$year <- pp$year[ai$pid]
ai$score <- as.numeric(score[as.character(ai$pid)])
impact <- function(year) {
  if (year < min(pp$year) + 2) return(rep(NA, nrow(reg)))
  s <- ai[ai$year >= year - 2 & ai$year <= year & !is.na(ai$score), ]
  m <- tapply(s$score, s$inst, mean)
  as.numeric(m[reg$id])
}

value <- function(ind, year) {
  # One value per institution in register order, NA when missing.
  if (ind == "citation_impact") return(impact(year))
  if (ind %in% names(wide)) {
    w <- wide[wide$year == year, c("institution", ind)]
    return(w[[ind]][match(reg$id, w$institution)])
  }
  l <- long[long$indicator == ind & long$year == year, ]
  l$value[match(reg$id, l$institution)]
}

# Population rule of both briefs: papers summed over 2023-2025 at least 600;
# an institution with no papers value in those years is left out too.
papers <- sapply(2023:2025, function(y) value("papers", y))
seen <- rowSums(!is.na(papers))
total <- rowSums(papers, na.rm = TRUE)
ranked <- seen > 0 & total >= 600
out <- data.frame(key = character(), value = character(), stringsAsFactors = FALSE)
put <- function(k, v) out[nrow(out) + 1, ] <<- list(k, format(v, digits = 15))
put("population/excluded", sum(!ranked))
put("population/ranked", sum(ranked))

# Coverage in the demo's Kestrian sector, 2025: members with a value / members.
kestria <- ranked & reg$country == "Kestria"
put("coverage/Kestrian sector/members", sum(kestria))
for (ind in c("citation_impact", "intl_staff_share", "intl_student_share")) {
  put(paste0("coverage/Kestrian sector/", ind), sum(kestria & !is.na(value(ind, 2025))))
}

# Client report: medians of field-normalised citation impact per year
# (R's median, the same under quantile types 6 and 7).
lusmara <- ranked & reg$country == "Lusmara"
agreed <- ranked & reg$id %in% c("LU001", "LU002", "OR003", "AL002", "NV003", "WI003", "KE002")
for (y in 2022:2025) { # three-year windows: the first ends in 2022
  v <- value("citation_impact", y)
  put(paste0("median/Lusmaran system/citation_impact/", y), median(v[lusmara], na.rm = TRUE))
  put(paste0("median/Agreed peers/citation_impact/", y), median(v[agreed], na.rm = TRUE))
  put(paste0("value/LU003/citation_impact/", y), v[reg$id == "LU003"])
}

# Research income per academic of LU003 in 2025 in international dollars:
# local currency divided by the PPP factor (local currency units per
# international dollar), then by academic staff (full-time equivalent).
f <- ppp$factor[ppp$country == "Lusmara" & ppp$year == 2025]
lu <- reg$id == "LU003"
put("value/LU003/research_income_per_academic/2025", value("research_income", 2025)[lu] / f / value("academic_staff", 2025)[lu])
write.csv(out, stdout(), row.names = FALSE, quote = FALSE)
