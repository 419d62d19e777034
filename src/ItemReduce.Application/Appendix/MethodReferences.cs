namespace ItemReduce.Application.Appendix;

/// <summary>
/// Full citations of the published methods the appendix may cite (APA style). The same citations
/// appear in the summary comments of the types implementing each method. Citations were written from
/// memory by the developers; page ranges should be checked before a manuscript quotes them.
/// </summary>
internal static class MethodReferences
{
    public const string Wilson1927 = "Wilson, E. B. (1927). Probable inference, the law of succession, and statistical inference. Journal of the American Statistical Association, 22(158), 209–212.";
    public const string OlssonDrasgowDorans1982 = "Olsson, U., Drasgow, F., & Dorans, N. J. (1982). The polyserial correlation coefficient. Psychometrika, 47(3), 337–347.";
    public const string RuscioRoche2012 = "Ruscio, J., & Roche, B. (2012). Determining the number of factors to retain in an exploratory factor analysis using comparison data of known factorial structure. Psychological Assessment, 24(2), 282–292.";
    public const string BraekenVanAssen2017 = "Braeken, J., & van Assen, M. A. L. M. (2017). An empirical Kaiser criterion. Psychological Methods, 22(3), 450–466.";
    public const string GarridoAbadPonsoda2013 = "Garrido, L. E., Abad, F. J., & Ponsoda, V. (2013). A new look at Horn's parallel analysis with ordinal variables. Psychological Methods, 18(4), 454–474.";
    public const string MannWhitney1947 = "Mann, H. B., & Whitney, D. R. (1947). On a test of whether one of two random variables is stochastically larger than the other. Annals of Mathematical Statistics, 18(1), 50–60.";
    public const string AuerswaldMoshagen2019 = "Auerswald, M., & Moshagen, M. (2019). How to determine the number of factors to retain in exploratory factor analysis: A comparison of extraction methods under realistic conditions. Psychological Methods, 24(4), 468–491.";
    public const string GoretzkoBuhner2020 = "Goretzko, D., & Bühner, M. (2020). One model to rule them all? Using machine learning algorithms to determine the number of factors in exploratory factor analysis. Psychological Methods, 25(6), 776–786.";
    public const string Friedman2001 = "Friedman, J. H. (2001). Greedy function approximation: A gradient boosting machine. The Annals of Statistics, 29(5), 1189–1232.";
    public const string LorenzoSevaTimmermanKiers2011 = "Lorenzo-Seva, U., Timmerman, M. E., & Kiers, H. A. L. (2011). The Hull method for selecting the number of common factors. Multivariate Behavioral Research, 46(2), 340–364.";
    public const string HumphreysIlgen1969 = "Humphreys, L. G., & Ilgen, D. R. (1969). Note on a criterion for the number of common factors. Educational and Psychological Measurement, 29(3), 571–578.";
    public const string Arbuckle1996 = "Arbuckle, J. L. (1996). Full information estimation in the presence of incomplete data. In G. A. Marcoulides & R. E. Schumacker (Eds.), Advanced structural equation modeling: Issues and techniques (pp. 243–277). Erlbaum.";
    public const string Bentler1990 = "Bentler, P. M. (1990). Comparative fit indexes in structural models. Psychological Bulletin, 107(2), 238–246.";
    public const string BrowneCudeck1993 = "Browne, M. W., & Cudeck, R. (1993). Alternative ways of assessing model fit. In K. A. Bollen & J. S. Long (Eds.), Testing structural equation models (pp. 136–162). Sage.";
    public const string HuBentler1999 = "Hu, L., & Bentler, P. M. (1999). Cutoff criteria for fit indexes in covariance structure analysis: Conventional criteria versus new alternatives. Structural Equation Modeling, 6(1), 1–55.";
    public const string JoanesGill1998 = "Joanes, D. N., & Gill, C. A. (1998). Comparing measures of sample skewness and kurtosis. Journal of the Royal Statistical Society: Series D (The Statistician), 47(1), 183–189.";
    public const string Joreskog1969 = "Jöreskog, K. G. (1969). A general approach to confirmatory maximum likelihood factor analysis. Psychometrika, 34(2), 183–202.";
    public const string SatorraBentler1994 = "Satorra, A., & Bentler, P. M. (1994). Corrections to test statistics and standard errors in covariance structure analysis. In A. von Eye & C. C. Clogg (Eds.), Latent variables analysis: Applications for developmental research (pp. 399–419). Sage.";
    public const string SteigerLind1980 = "Steiger, J. H., & Lind, J. C. (1980, May). Statistically based tests for the number of common factors. Paper presented at the annual meeting of the Psychometric Society, Iowa City, IA.";
    public const string TuckerLewis1973 = "Tucker, L. R., & Lewis, C. (1973). A reliability coefficient for maximum likelihood factor analysis. Psychometrika, 38(1), 1–10.";
    public const string YuanBentler2000 = "Yuan, K.-H., & Bentler, P. M. (2000). Three likelihood-based methods for mean and covariance structure analysis with nonnormal missing data. Sociological Methodology, 30(1), 165–200.";
    public const string Bartlett1933 = "Bartlett, M. S. (1933). On the theory of statistical regression. Proceedings of the Royal Society of Edinburgh, 53, 260–283.";
    public const string Bartlett1950 = "Bartlett, M. S. (1950). Tests of significance in factor analysis. British Journal of Psychology (Statistical Section), 3(2), 77–85.";
    public const string BlackmanVigna2021 = "Blackman, D., & Vigna, S. (2021). Scrambled linear pseudorandom number generators. ACM Transactions on Mathematical Software, 47(4), Article 36.";
    public const string BujaEyuboglu1992 = "Buja, A., & Eyuboglu, N. (1992). Remarks on parallel analysis. Multivariate Behavioral Research, 27(4), 509–540.";
    public const string Cronbach1951 = "Cronbach, L. J. (1951). Coefficient alpha and the internal structure of tests. Psychometrika, 16(3), 297–334.";
    public const string Dunn2018 = "Dunn, A. M., Heggestad, E. D., Shanock, L. R., & Theilgan, N. (2018). Intra-individual response variability as an indicator of insufficient effort responding: Comparison to other indicators and relationships with individual differences. Journal of Business and Psychology, 33(1), 105–121.";
    public const string Feldt1965 = "Feldt, L. S. (1965). The approximate sampling distribution of Kuder-Richardson reliability coefficient twenty. Psychometrika, 30(3), 357–370.";
    public const string Glorfeld1995 = "Glorfeld, L. W. (1995). An improvement on Horn's parallel analysis methodology for selecting the correct number of factors to retain. Educational and Psychological Measurement, 55(3), 377–393.";
    public const string HarmanJones1966 = "Harman, H. H., & Jones, W. H. (1966). Factor analysis by minimizing residuals (minres). Psychometrika, 31(3), 351–368.";
    public const string HendricksonWhite1964 = "Hendrickson, A. E., & White, P. O. (1964). Promax: A quick method for rotation to oblique simple structure. British Journal of Statistical Psychology, 17(1), 65–70.";
    public const string Higham2002 = "Higham, N. J. (2002). Computing the nearest correlation matrix—a problem from finance. IMA Journal of Numerical Analysis, 22(3), 329–343.";
    public const string Horn1965 = "Horn, J. L. (1965). A rationale and test for the number of factors in factor analysis. Psychometrika, 30(2), 179–185.";
    public const string Jennrich2002 = "Jennrich, R. I. (2002). A simple general method for oblique rotation. Psychometrika, 67(1), 7–19.";
    public const string Johnson2005 = "Johnson, J. A. (2005). Ascertaining the validity of individual protocols from Web-based personality inventories. Journal of Research in Personality, 39(1), 103–129.";
    public const string Joreskog1967 = "Jöreskog, K. G. (1967). Some contributions to maximum likelihood factor analysis. Psychometrika, 32(4), 443–482.";
    public const string Kaiser1958 = "Kaiser, H. F. (1958). The varimax criterion for analytic rotation in factor analysis. Psychometrika, 23(3), 187–200.";
    public const string Kaiser1960 = "Kaiser, H. F. (1960). The application of electronic computers to factor analysis. Educational and Psychological Measurement, 20(1), 141–151.";
    public const string Kaiser1974 = "Kaiser, H. F. (1974). An index of factorial simplicity. Psychometrika, 39(1), 31–36.";
    public const string Levy1967 = "Levy, P. (1967). The correction for spurious correlation in the evaluation of short-form tests. Journal of Clinical Psychology, 23(1), 84–86.";
    public const string Mahalanobis1936 = "Mahalanobis, P. C. (1936). On the generalised distance in statistics. Proceedings of the National Institute of Sciences of India, 2(1), 49–55.";
    public const string MarsagliaTsang2000 = "Marsaglia, G., & Tsang, W. W. (2000). A simple method for generating gamma variables. ACM Transactions on Mathematical Software, 26(3), 363–372.";
    public const string SchmidLeiman1957 = "Schmid, J., & Leiman, J. M. (1957). The development of hierarchical factor solutions. Psychometrika, 22(1), 53–61.";
    public const string Zinbarg2005 = "Zinbarg, R. E., Revelle, W., Yovel, I., & Li, W. (2005). Cronbach's α, Revelle's β, and McDonald's ω_H: Their relations with each other and two alternative conceptualizations of reliability. Psychometrika, 70(1), 123–133.";
    public const string McDonald1999 = "McDonald, R. P. (1999). Test theory: A unified treatment. Lawrence Erlbaum.";
    public const string MeadeCraig2012 = "Meade, A. W., & Craig, S. B. (2012). Identifying careless responses in survey data. Psychological Methods, 17(3), 437–455.";
    public const string Pearson1896 = "Pearson, K. (1896). Mathematical contributions to the theory of evolution. III. Regression, heredity, and panmixia. Philosophical Transactions of the Royal Society of London A, 187, 253–318.";
    public const string Olsson1979 = "Olsson, U. (1979). Maximum likelihood estimation of the polychoric correlation coefficient. Psychometrika, 44(4), 443–460.";
    public const string LittleSmith1987 = "Little, R. J. A., & Smith, P. J. (1987). Editing and imputation for quantitative survey data. Journal of the American Statistical Association, 82(397), 58–68.";
    public const string VaradhanRoland2008 = "Varadhan, R., & Roland, C. (2008). Simple and globally convergent methods for accelerating the convergence of any EM algorithm. Scandinavian Journal of Statistics, 35(2), 335–353.";
    public const string DempsterLairdRubin1977 = "Dempster, A. P., Laird, N. M., & Rubin, D. B. (1977). Maximum likelihood from incomplete data via the EM algorithm. Journal of the Royal Statistical Society B, 39(1), 1–38.";
    public const string Beasley2009 = "Beasley, T. M., Erickson, S., & Allison, D. B. (2009). Rank-based inverse normal transformations are increasingly used, but are they merited? Behavior Genetics, 39(5), 580–595.";
    public const string MendellElston1974 = "Mendell, N. R., & Elston, R. C. (1974). Multifactorial qualitative traits: Genetic analysis and prediction of recurrence risks. Biometrics, 30(1), 41–57.";
    public const string TrinhGenz2015 = "Trinh, G., & Genz, A. (2015). Bivariate conditioning approximations for multivariate normal probabilities. Statistics and Computing, 25(5), 989–996.";
    public const string Wilks1963 = "Wilks, S. S. (1963). Multivariate statistical outliers. Sankhyā A, 25(4), 407–426.";
    public const string Curran2016 = "Curran, P. G. (2016). Methods for the detection of carelessly invalid responses in survey data. Journal of Experimental Social Psychology, 66, 4–19.";
    public const string Velicer1976 = "Velicer, W. F. (1976). Determining the number of components from the matrix of partial correlations. Psychometrika, 41(3), 321–327.";
    public const string VelicerEatonFava2000 = "Velicer, W. F., Eaton, C. A., & Fava, J. L. (2000). Construct explication through factor or component analysis: A review and evaluation of alternative procedures for determining the number of factors or components. In R. D. Goffin & E. Helmes (Eds.), Problems and solutions in human assessment (pp. 41–71). Kluwer.";
}

/// <summary>
/// Full citations of the numerical and computing works the code follows (eigensolvers, integrals, random numbers,
/// minimisers, quantile rules). They are cited in the summary comments of the implementing types and listed in the
/// README; the appendix does not list them. Together with <see cref="MethodReferences"/> this is the one registry of
/// cited works: a test ties every citation in the code to an entry here and the README's reference list to both
/// classes. Written from memory by the developers.
/// </summary>
internal static class ComputingReferences
{
    public const string Anderson2003 = "Anderson, T. W. (2003). An introduction to multivariate statistical analysis (3rd ed.). Wiley.";
    public const string AndersonEtAl1999 = "Anderson, E., Bai, Z., Bischof, C., Blackford, S., Demmel, J., Dongarra, J., Du Croz, J., Greenbaum, A., Hammarling, S., McKenney, A., & Sorensen, D. (1999). LAPACK users' guide (3rd ed.). SIAM.";
    public const string Benoit1924 = "Benoît, Commandant (1924). Note sur une méthode de résolution des équations normales provenant de l'application de la méthode des moindres carrés à un système d'équations linéaires en nombre inférieur à celui des inconnues (Procédé du Commandant Cholesky). Bulletin Géodésique, 2, 67–77.";
    public const string BirginMartinezRaydan2000 = "Birgin, E. G., Martínez, J. M., & Raydan, M. (2000). Nonmonotone spectral projected gradient methods on convex sets. SIAM Journal on Optimization, 10(4), 1196–1211.";
    public const string BowdlerMartinReinschWilkinson1968 = "Bowdler, H., Martin, R. S., Reinsch, C., & Wilkinson, J. H. (1968). The QR and QL algorithms for symmetric matrices. Numerische Mathematik, 11(3), 293–306.";
    public const string Brent1973 = "Brent, R. P. (1973). Algorithms for minimization without derivatives. Prentice-Hall.";
    public const string Browne1974 = "Browne, M. W. (1974). Generalized least squares estimators in the analysis of covariance structures. South African Statistical Journal, 8(1), 1–24.";
    public const string CrouxHaesbroeck1999 = "Croux, C., & Haesbroeck, G. (1999). Influence function and efficiency of the minimum covariance determinant scatter matrix estimator. Journal of Multivariate Analysis, 71(2), 161–190.";
    public const string DongarraHammarlingSorensen1989 = "Dongarra, J. J., Hammarling, S. J., & Sorensen, D. C. (1989). Block reduction of matrices to condensed forms for eigenvalue computations. Journal of Computational and Applied Mathematics, 27(1–2), 215–227.";
    public const string DreznerWesolowsky1990 = "Drezner, Z., & Wesolowsky, G. O. (1990). On the computation of the bivariate normal integral. Journal of Statistical Computation and Simulation, 35(1–2), 101–107.";
    public const string DowellJarratt1971 = "Dowell, M., & Jarratt, P. (1971). A modified regula falsi method for computing the root of an equation. BIT Numerical Mathematics, 11(2), 168–174.";
    public const string Dwyer1939 = "Dwyer, P. S. (1939). The contribution of an orthogonal multiple factor solution to multiple correlation. Psychometrika, 4(2), 163–171.";
    public const string Genz2004 = "Genz, A. (2004). Numerical computation of rectangular bivariate and trivariate normal and t probabilities. Statistics and Computing, 14(3), 251–260.";
    public const string GolubVanLoan2013 = "Golub, G. H., & Van Loan, C. F. (2013). Matrix computations (4th ed.). Johns Hopkins University Press.";
    public const string Guttman1954 = "Guttman, L. (1954). Some necessary conditions for common-factor analysis. Psychometrika, 19(2), 149–161.";
    public const string Guttman1956 = "Guttman, L. (1956). \"Best possible\" systematic estimates of communalities. Psychometrika, 21(3), 273–285.";
    public const string HyndmanFan1996 = "Hyndman, R. J., & Fan, Y. (1996). Sample quantiles in statistical packages. The American Statistician, 50(4), 361–365.";
    public const string Kaiser1970 = "Kaiser, H. F. (1970). A second generation little jiffy. Psychometrika, 35(4), 401–415.";
    public const string LawleyMaxwell1971 = "Lawley, D. N., & Maxwell, A. E. (1971). Factor analysis as a statistical method (2nd ed.). Butterworths.";
    public const string Lanczos1950 = "Lanczos, C. (1950). An iteration method for the solution of the eigenvalue problem of linear " +
        "differential and integral operators. Journal of Research of the National Bureau of Standards, 45(4), 255–282.";
    public const string MulaKurzLemire2018 = "Muła, W., Kurz, N., & Lemire, D. (2018). Faster population counts using AVX2 instructions. The Computer Journal, 61(1), 111–120.";
    public const string Pearson1900 = "Pearson, K. (1900). Mathematical contributions to the theory of evolution. VII. On the correlation of characters not quantitatively measurable. Philosophical Transactions of the Royal Society of London A, 195, 1–47.";
    public const string Lemire2019 = "Lemire, D. (2019). Fast random integer generation in an interval. ACM Transactions on Modeling and Computer Simulation, 29(1), Article 3.";
    public const string MartinReinschWilkinson1968 = "Martin, R. S., Reinsch, C., & Wilkinson, J. H. (1968). Householder's tridiagonalization of a symmetric matrix. Numerische Mathematik, 11(3), 181–195.";
    public const string NocedalWright2006 = "Nocedal, J., & Wright, S. J. (2006). Numerical optimization (2nd ed.). Springer.";
    public const string OdellFeiveson1966 = "Odell, P. L., & Feiveson, A. H. (1966). A numerical procedure to generate a sample covariance matrix. Journal of the American Statistical Association, 61(313), 199–203.";
    public const string Parlett1998 = "Parlett, B. N. (1998). The symmetric eigenvalue problem (Classics in Applied Mathematics 20). SIAM.";
    public const string Plackett1954 = "Plackett, R. L. (1954). A reduction formula for normal multivariate integrals. Biometrika, 41(3/4), 351–360.";
    public const string Smith1976 = "Smith, B. T., Boyle, J. M., Dongarra, J. J., Garbow, B. S., Ikebe, Y., Klema, V. C., & Moler, C. B. (1976). Matrix eigensystem routines — EISPACK guide (2nd ed.). Springer.";
    public const string SteeleLeaFlood2014 = "Steele, G. L., Lea, D., & Flood, C. H. (2014). Fast splittable pseudorandom number generators. ACM SIGPLAN Notices, 49(10), 453–472 (OOPSLA 2014).";
    public const string WilkinsonReinsch1971 = "Wilkinson, J. H., & Reinsch, C. (1971). Handbook for automatic computation, Vol. II: Linear algebra. Springer.";
    public const string ZwickVelicer1986 = "Zwick, W. R., & Velicer, W. F. (1986). Comparison of five rules for determining the number of components to retain. Psychological Bulletin, 99(3), 432–442.";
}
