using System;
using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.Sqlite
{
    /// <inheritdoc />
    public partial class Ledger : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.CreateTable(
                name: "AuditEvents",
                columns: table => new
                {
                    Id = table.Column<long>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    At = table.Column<DateTimeOffset>(type: "TEXT", nullable: false),
                    UserId = table.Column<string>(type: "TEXT", nullable: false),
                    Action = table.Column<string>(type: "TEXT", maxLength: 60, nullable: false),
                    EntityType = table.Column<string>(type: "TEXT", maxLength: 60, nullable: false),
                    EntityId = table.Column<string>(type: "TEXT", maxLength: 60, nullable: false),
                    Summary = table.Column<string>(type: "TEXT", nullable: false),
                    Before = table.Column<string>(type: "TEXT", nullable: true),
                    After = table.Column<string>(type: "TEXT", nullable: true)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AuditEvents", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "StoredFiles",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    Sha256 = table.Column<string>(type: "TEXT", maxLength: 64, nullable: false),
                    FileName = table.Column<string>(type: "TEXT", maxLength: 400, nullable: false),
                    SizeBytes = table.Column<long>(type: "INTEGER", nullable: false),
                    Content = table.Column<byte[]>(type: "BLOB", nullable: false),
                    UploadedByUserId = table.Column<string>(type: "TEXT", nullable: false),
                    UploadedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_StoredFiles", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "Studies",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    Name = table.Column<string>(type: "TEXT", maxLength: 200, nullable: false),
                    Description = table.Column<string>(type: "TEXT", maxLength: 4000, nullable: false),
                    OwnerUserId = table.Column<string>(type: "TEXT", nullable: true),
                    CreatedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false),
                    Retired = table.Column<bool>(type: "INTEGER", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "TEXT", nullable: true),
                    Version = table.Column<long>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Studies", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "EnergyModels",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    StudyId = table.Column<int>(type: "INTEGER", nullable: true),
                    EnergyLevel = table.Column<string>(type: "TEXT", nullable: false),
                    ThermalLevel = table.Column<string>(type: "TEXT", nullable: false),
                    TemperatureKelvin = table.Column<double>(type: "REAL", nullable: false),
                    StandardState = table.Column<string>(type: "TEXT", maxLength: 30, nullable: false),
                    Treatment = table.Column<string>(type: "TEXT", maxLength: 40, nullable: false),
                    QuasiRrhoCutoffCm1 = table.Column<double>(type: "REAL", nullable: false),
                    Tunnelling = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    DisplayUnit = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    SignificantImaginaryCm1 = table.Column<double>(type: "REAL", nullable: false),
                    ScanJumpKcalPerMol = table.Column<double>(type: "REAL", nullable: false),
                    UpdatedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false),
                    UpdatedByUserId = table.Column<string>(type: "TEXT", nullable: false),
                    Version = table.Column<long>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_EnergyModels", x => x.Id);
                    table.ForeignKey(
                        name: "FK_EnergyModels_Studies_StudyId",
                        column: x => x.StudyId,
                        principalTable: "Studies",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Reactions",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    StudyId = table.Column<int>(type: "INTEGER", nullable: false),
                    Label = table.Column<string>(type: "TEXT", maxLength: 200, nullable: false),
                    Description = table.Column<string>(type: "TEXT", nullable: false),
                    OwnerUserId = table.Column<string>(type: "TEXT", nullable: false),
                    InputsRevision = table.Column<long>(type: "INTEGER", nullable: false),
                    Retired = table.Column<bool>(type: "INTEGER", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "TEXT", nullable: true),
                    Version = table.Column<long>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Reactions", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Reactions_Studies_StudyId",
                        column: x => x.StudyId,
                        principalTable: "Studies",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Species",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    StudyId = table.Column<int>(type: "INTEGER", nullable: false),
                    Label = table.Column<string>(type: "TEXT", maxLength: 200, nullable: false),
                    Charge = table.Column<int>(type: "INTEGER", nullable: false),
                    Multiplicity = table.Column<int>(type: "INTEGER", nullable: false),
                    Formula = table.Column<string>(type: "TEXT", maxLength: 200, nullable: false),
                    SymmetryNumber = table.Column<int>(type: "INTEGER", nullable: false),
                    Retired = table.Column<bool>(type: "INTEGER", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "TEXT", nullable: true),
                    Version = table.Column<long>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Species", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Species_Studies_StudyId",
                        column: x => x.StudyId,
                        principalTable: "Studies",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Uploads",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    Key = table.Column<string>(type: "TEXT", maxLength: 100, nullable: false),
                    StudyId = table.Column<int>(type: "INTEGER", nullable: false),
                    UploaderUserId = table.Column<string>(type: "TEXT", nullable: false),
                    At = table.Column<DateTimeOffset>(type: "TEXT", nullable: false),
                    Summary = table.Column<string>(type: "TEXT", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Uploads", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Uploads_Studies_StudyId",
                        column: x => x.StudyId,
                        principalTable: "Studies",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "ReactionDerivations",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    ReactionId = table.Column<int>(type: "INTEGER", nullable: false),
                    BarrierGibbsHartree = table.Column<double>(type: "REAL", nullable: true),
                    ReactionGibbsHartree = table.Column<double>(type: "REAL", nullable: true),
                    BarrierElectronicHartree = table.Column<double>(type: "REAL", nullable: true),
                    RateConstantPerSecond = table.Column<double>(type: "REAL", nullable: true),
                    HalfLifeSeconds = table.Column<double>(type: "REAL", nullable: true),
                    TemperatureKelvin = table.Column<double>(type: "REAL", nullable: false),
                    LevelOfTheory = table.Column<string>(type: "TEXT", nullable: false),
                    Consistent = table.Column<bool>(type: "INTEGER", nullable: false),
                    ConsistencyJson = table.Column<string>(type: "TEXT", nullable: false),
                    StatesJson = table.Column<string>(type: "TEXT", nullable: false),
                    StepsJson = table.Column<string>(type: "TEXT", nullable: false),
                    ModelFingerprint = table.Column<string>(type: "TEXT", nullable: false),
                    InputFingerprint = table.Column<string>(type: "TEXT", nullable: false),
                    InputsRevision = table.Column<long>(type: "INTEGER", nullable: false),
                    ComputedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ReactionDerivations", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ReactionDerivations_Reactions_ReactionId",
                        column: x => x.ReactionId,
                        principalTable: "Reactions",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "Calculations",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    SpeciesId = table.Column<int>(type: "INTEGER", nullable: false),
                    UploadId = table.Column<int>(type: "INTEGER", nullable: false),
                    Label = table.Column<string>(type: "TEXT", maxLength: 200, nullable: false),
                    Kind = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    LevelOfTheory = table.Column<string>(type: "TEXT", maxLength: 400, nullable: false),
                    Method = table.Column<string>(type: "TEXT", nullable: false),
                    Basis = table.Column<string>(type: "TEXT", nullable: false),
                    Solvation = table.Column<string>(type: "TEXT", nullable: false),
                    GeometryLevel = table.Column<string>(type: "TEXT", nullable: false),
                    EnergyLevelKey = table.Column<string>(type: "TEXT", maxLength: 400, nullable: false),
                    EnergyHartree = table.Column<double>(type: "REAL", nullable: true),
                    AtomCount = table.Column<int>(type: "INTEGER", nullable: false),
                    AtomicNumbers = table.Column<byte[]>(type: "BLOB", nullable: true),
                    PositionsAngstrom = table.Column<byte[]>(type: "BLOB", nullable: true),
                    FrequenciesCm1 = table.Column<byte[]>(type: "BLOB", nullable: true),
                    Modes = table.Column<byte[]>(type: "BLOB", nullable: true),
                    HessianHartreePerBohr2 = table.Column<byte[]>(type: "BLOB", nullable: true),
                    ThermalTemperatureKelvin = table.Column<double>(type: "REAL", nullable: true),
                    ZeroPointHartree = table.Column<double>(type: "REAL", nullable: true),
                    EnthalpyCorrectionHartree = table.Column<double>(type: "REAL", nullable: true),
                    GibbsCorrectionHartree = table.Column<double>(type: "REAL", nullable: true),
                    StoredFileId = table.Column<int>(type: "INTEGER", nullable: true),
                    SourceSha256 = table.Column<string>(type: "TEXT", maxLength: 64, nullable: false),
                    Note = table.Column<string>(type: "TEXT", nullable: false),
                    UploadedByUserId = table.Column<string>(type: "TEXT", nullable: false),
                    UploadedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false),
                    Retired = table.Column<bool>(type: "INTEGER", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "TEXT", nullable: true),
                    Version = table.Column<long>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Calculations", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Calculations_Species_SpeciesId",
                        column: x => x.SpeciesId,
                        principalTable: "Species",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Calculations_StoredFiles_StoredFileId",
                        column: x => x.StoredFileId,
                        principalTable: "StoredFiles",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Calculations_Uploads_UploadId",
                        column: x => x.UploadId,
                        principalTable: "Uploads",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Scans",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    SpeciesId = table.Column<int>(type: "INTEGER", nullable: false),
                    UploadId = table.Column<int>(type: "INTEGER", nullable: false),
                    Label = table.Column<string>(type: "TEXT", nullable: false),
                    LevelOfTheory = table.Column<string>(type: "TEXT", nullable: false),
                    CoordinateKind = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    CoordinateAtoms = table.Column<string>(type: "TEXT", nullable: false),
                    AtomicNumbers = table.Column<byte[]>(type: "BLOB", nullable: true),
                    StoredFileId = table.Column<int>(type: "INTEGER", nullable: true),
                    SourceSha256 = table.Column<string>(type: "TEXT", nullable: false),
                    UploadedByUserId = table.Column<string>(type: "TEXT", nullable: false),
                    UploadedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false),
                    Retired = table.Column<bool>(type: "INTEGER", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "TEXT", nullable: true),
                    Version = table.Column<long>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Scans", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Scans_Species_SpeciesId",
                        column: x => x.SpeciesId,
                        principalTable: "Species",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Scans_StoredFiles_StoredFileId",
                        column: x => x.StoredFileId,
                        principalTable: "StoredFiles",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Scans_Uploads_UploadId",
                        column: x => x.UploadId,
                        principalTable: "Uploads",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "FrequencyChecks",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    CalculationId = table.Column<int>(type: "INTEGER", nullable: false),
                    Verdict = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    ReasonsJson = table.Column<string>(type: "TEXT", nullable: false),
                    EvidenceJson = table.Column<string>(type: "TEXT", nullable: false),
                    InputFingerprint = table.Column<string>(type: "TEXT", nullable: false),
                    ComputedAt = table.Column<DateTimeOffset>(type: "TEXT", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_FrequencyChecks", x => x.Id);
                    table.ForeignKey(
                        name: "FK_FrequencyChecks_Calculations_CalculationId",
                        column: x => x.CalculationId,
                        principalTable: "Calculations",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "ReactionStates",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    ReactionId = table.Column<int>(type: "INTEGER", nullable: false),
                    Position = table.Column<int>(type: "INTEGER", nullable: false),
                    Label = table.Column<string>(type: "TEXT", maxLength: 200, nullable: false),
                    Kind = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    SaddleCalculationId = table.Column<int>(type: "INTEGER", nullable: true)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ReactionStates", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ReactionStates_Calculations_SaddleCalculationId",
                        column: x => x.SaddleCalculationId,
                        principalTable: "Calculations",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_ReactionStates_Reactions_ReactionId",
                        column: x => x.ReactionId,
                        principalTable: "Reactions",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "Reviews",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    CalculationId = table.Column<int>(type: "INTEGER", nullable: false),
                    Outcome = table.Column<string>(type: "TEXT", maxLength: 20, nullable: false),
                    Comment = table.Column<string>(type: "TEXT", maxLength: 4000, nullable: false),
                    ReviewerUserId = table.Column<string>(type: "TEXT", nullable: false),
                    At = table.Column<DateTimeOffset>(type: "TEXT", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Reviews", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Reviews_Calculations_CalculationId",
                        column: x => x.CalculationId,
                        principalTable: "Calculations",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "ScanPoints",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    ScanId = table.Column<int>(type: "INTEGER", nullable: false),
                    Index = table.Column<int>(type: "INTEGER", nullable: false),
                    Coordinate = table.Column<double>(type: "REAL", nullable: false),
                    EnergyHartree = table.Column<double>(type: "REAL", nullable: false),
                    Converged = table.Column<bool>(type: "INTEGER", nullable: false),
                    PositionsAngstrom = table.Column<byte[]>(type: "BLOB", nullable: true)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ScanPoints", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ScanPoints_Scans_ScanId",
                        column: x => x.ScanId,
                        principalTable: "Scans",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "ReactionCoordinatePairs",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    ReactionStateId = table.Column<int>(type: "INTEGER", nullable: false),
                    AtomA = table.Column<int>(type: "INTEGER", nullable: false),
                    AtomB = table.Column<int>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ReactionCoordinatePairs", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ReactionCoordinatePairs_ReactionStates_ReactionStateId",
                        column: x => x.ReactionStateId,
                        principalTable: "ReactionStates",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "ReactionStateTerms",
                columns: table => new
                {
                    Id = table.Column<int>(type: "INTEGER", nullable: false)
                        .Annotation("Sqlite:Autoincrement", true),
                    ReactionStateId = table.Column<int>(type: "INTEGER", nullable: false),
                    SpeciesId = table.Column<int>(type: "INTEGER", nullable: false),
                    Coefficient = table.Column<int>(type: "INTEGER", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ReactionStateTerms", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ReactionStateTerms_ReactionStates_ReactionStateId",
                        column: x => x.ReactionStateId,
                        principalTable: "ReactionStates",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                    table.ForeignKey(
                        name: "FK_ReactionStateTerms_Species_SpeciesId",
                        column: x => x.SpeciesId,
                        principalTable: "Species",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateIndex(
                name: "IX_AuditEvents_EntityType_EntityId",
                table: "AuditEvents",
                columns: new[] { "EntityType", "EntityId" });

            migrationBuilder.CreateIndex(
                name: "IX_Calculations_SpeciesId_Kind",
                table: "Calculations",
                columns: new[] { "SpeciesId", "Kind" });

            migrationBuilder.CreateIndex(
                name: "IX_Calculations_SpeciesId_SourceSha256_Label",
                table: "Calculations",
                columns: new[] { "SpeciesId", "SourceSha256", "Label" });

            migrationBuilder.CreateIndex(
                name: "IX_Calculations_StoredFileId",
                table: "Calculations",
                column: "StoredFileId");

            migrationBuilder.CreateIndex(
                name: "IX_Calculations_UploadId",
                table: "Calculations",
                column: "UploadId");

            migrationBuilder.CreateIndex(
                name: "IX_EnergyModels_StudyId",
                table: "EnergyModels",
                column: "StudyId",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_FrequencyChecks_CalculationId",
                table: "FrequencyChecks",
                column: "CalculationId",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_ReactionCoordinatePairs_ReactionStateId",
                table: "ReactionCoordinatePairs",
                column: "ReactionStateId");

            migrationBuilder.CreateIndex(
                name: "IX_ReactionDerivations_ReactionId",
                table: "ReactionDerivations",
                column: "ReactionId",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStateTerms_ReactionStateId",
                table: "ReactionStateTerms",
                column: "ReactionStateId");

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStateTerms_SpeciesId",
                table: "ReactionStateTerms",
                column: "SpeciesId");

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStates_ReactionId_Position",
                table: "ReactionStates",
                columns: new[] { "ReactionId", "Position" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStates_SaddleCalculationId",
                table: "ReactionStates",
                column: "SaddleCalculationId");

            migrationBuilder.CreateIndex(
                name: "IX_Reactions_StudyId_Label",
                table: "Reactions",
                columns: new[] { "StudyId", "Label" });

            migrationBuilder.CreateIndex(
                name: "IX_Reviews_CalculationId_Id",
                table: "Reviews",
                columns: new[] { "CalculationId", "Id" });

            migrationBuilder.CreateIndex(
                name: "IX_ScanPoints_ScanId_Index",
                table: "ScanPoints",
                columns: new[] { "ScanId", "Index" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Scans_SpeciesId",
                table: "Scans",
                column: "SpeciesId");

            migrationBuilder.CreateIndex(
                name: "IX_Scans_StoredFileId",
                table: "Scans",
                column: "StoredFileId");

            migrationBuilder.CreateIndex(
                name: "IX_Scans_UploadId",
                table: "Scans",
                column: "UploadId");

            migrationBuilder.CreateIndex(
                name: "IX_Species_StudyId_Label",
                table: "Species",
                columns: new[] { "StudyId", "Label" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_StoredFiles_Sha256",
                table: "StoredFiles",
                column: "Sha256",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Studies_Name",
                table: "Studies",
                column: "Name");

            migrationBuilder.CreateIndex(
                name: "IX_Uploads_Key",
                table: "Uploads",
                column: "Key",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Uploads_StudyId",
                table: "Uploads",
                column: "StudyId");
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropTable(
                name: "AuditEvents");

            migrationBuilder.DropTable(
                name: "EnergyModels");

            migrationBuilder.DropTable(
                name: "FrequencyChecks");

            migrationBuilder.DropTable(
                name: "ReactionCoordinatePairs");

            migrationBuilder.DropTable(
                name: "ReactionDerivations");

            migrationBuilder.DropTable(
                name: "ReactionStateTerms");

            migrationBuilder.DropTable(
                name: "Reviews");

            migrationBuilder.DropTable(
                name: "ScanPoints");

            migrationBuilder.DropTable(
                name: "ReactionStates");

            migrationBuilder.DropTable(
                name: "Scans");

            migrationBuilder.DropTable(
                name: "Calculations");

            migrationBuilder.DropTable(
                name: "Reactions");

            migrationBuilder.DropTable(
                name: "Species");

            migrationBuilder.DropTable(
                name: "StoredFiles");

            migrationBuilder.DropTable(
                name: "Uploads");

            migrationBuilder.DropTable(
                name: "Studies");
        }
    }
}
