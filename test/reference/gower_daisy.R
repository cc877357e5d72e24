# Gower dissimilarities from R's cluster::daisy (Debian r-base-core, r-cran-cluster) on the flower
# data shipped with the cluster package (Struyf, Hubert & Rousseeuw 1997), plain and with V3 as
# asymmetric binary, plus a mixed table with missing values of our own making.
# Writes fixtures/gower_daisy.json. Run: Rscript test/reference/gower_daisy.R
suppressPackageStartupMessages(library(cluster))

num <- function(x) ifelse(is.na(x), "null", sprintf("%.17g", x))
arr <- function(x) paste0("[", paste(num(x), collapse = ", "), "]")
str <- function(s) paste0("\"", gsub("\"", "\\\\\"", s), "\"")
strs <- function(s) paste0("[", paste(vapply(s, str, ""), collapse = ", "), "]")

# One column as our MixedColumn: kind, values (NA -> null), levels, asymmetric.
column <- function(df, name, kind, asym = FALSE) {
  x <- df[[name]]
  if (kind == "binary") values <- as.integer(as.character(x))
  else if (kind %in% c("categorical", "ordinal")) values <- as.integer(x) - 1L
  else values <- as.numeric(x)
  levels <- if (is.factor(x)) paste0(", \"levels\": ", strs(levels(x))) else ""
  paste0("{\"name\": ", str(name), ", \"kind\": ", str(kind), ", \"asymmetric\": ", tolower(asym),
         levels, ", \"values\": ", arr(values), "}")
}
table <- function(df, kinds, asym = character(0)) {
  cols <- vapply(names(kinds), function(nm) column(df, nm, kinds[[nm]], nm %in% asym), "")
  paste0("[", paste(cols, collapse = ",\n  "), "]")
}

data(flower, package = "cluster")
flowerKinds <- list(V1 = "binary", V2 = "binary", V3 = "binary", V4 = "categorical",
                    V5 = "ordinal", V6 = "ordinal", V7 = "numeric", V8 = "numeric")
plain <- daisy(flower, metric = "gower")
asym3 <- daisy(flower, metric = "gower", type = list(asymm = 3))
weighted <- daisy(flower, metric = "gower", type = list(asymm = 3), weights = c(1, 2, 1, 0.5, 1, 3, 1, 0.25))

# Our own mixed table with missing values: seed fixed, 12 rows.
set.seed(20261202)
n <- 12
own <- data.frame(
  size = round(rnorm(n, 50, 15), 3),
  flat = rep(7, n),                                     # a constant column: contributes 0, still counted
  colour = factor(sample(c("red", "green", "blue"), n, replace = TRUE)),
  grade = factor(sample(c("low", "mid", "high"), n, replace = TRUE), levels = c("low", "mid", "high"), ordered = TRUE),
  member = sample(0:1, n, replace = TRUE),             # symmetric binary
  owns = sample(0:1, n, replace = TRUE, prob = c(0.7, 0.3)) # asymmetric binary
)
own$size[c(2, 9)] <- NA
own$colour[c(4)] <- NA
own$grade[c(2, 11)] <- NA
own$owns[c(5)] <- NA
ownKinds <- list(size = "numeric", flat = "numeric", colour = "categorical", grade = "ordinal",
                 member = "binary", owns = "binary")
ownD <- suppressWarnings(daisy(own, metric = "gower", type = list(symm = "member", asymm = "owns")))

# The complete rows of the own table without the asymmetric column, as a study() sees them: the
# constant column "flat" must still count in Gower's average (31/30-style factor otherwise).
complete <- own[complete.cases(own), c("size", "flat", "colour", "grade", "member")]
completeD <- daisy(complete, metric = "gower", type = list(symm = "member"))
records <- vapply(seq_len(nrow(complete)), function(i) {
  r <- complete[i, ]
  paste0("{\"id\": ", str(paste0("r", i)), ", \"size\": ", num(r$size), ", \"flat\": ", num(r$flat),
         ", \"colour\": ", str(as.character(r$colour)), ", \"grade\": ", str(as.character(r$grade)),
         ", \"member\": ", num(r$member), "}")
}, "")

json <- paste0(
  "{\n \"producedBy\": ", str(paste0(R.version.string, ", cluster ", packageVersion("cluster"), " daisy(metric = \"gower\")")),
  ",\n \"source\": ", str("flower data of Struyf, Hubert & Rousseeuw (1997) as shipped in R's cluster package (data(flower)); 'own' table: data of our own making, set.seed(20261202) in this script"),
  ",\n \"flower\": {\n  \"columns\": ", table(flower, flowerKinds),
  ",\n  \"plain\": ", arr(as.vector(plain)),
  ",\n  \"asymmetricV3\": ", arr(as.vector(asym3)),
  ",\n  \"weights\": ", arr(c(1, 2, 1, 0.5, 1, 3, 1, 0.25)),
  ",\n  \"weightedAsymmetricV3\": ", arr(as.vector(weighted)),
  "\n },\n \"own\": {\n  \"columns\": ", table(own, ownKinds, asym = "owns"),
  ",\n  \"condensed\": ", arr(as.vector(ownD)),
  "\n },\n \"ownComplete\": {\n  \"records\": [", paste(records, collapse = ",\n   "), "]",
  ",\n  \"condensed\": ", arr(as.vector(completeD)),
  "\n }\n}\n")
args <- commandArgs(trailingOnly = FALSE)
here <- dirname(normalizePath(sub("^--file=", "", args[grep("^--file=", args)])))
out <- file.path(here, "fixtures", "gower_daisy.json")
writeLines(json, out)
cat("wrote", out, "\n")
