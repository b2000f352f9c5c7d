using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.Sqlite
{
    /// <inheritdoc />
    public partial class StoredFileUploaderSize : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.CreateIndex(
                name: "IX_StoredFiles_UploadedByUserId_SizeBytes",
                table: "StoredFiles",
                columns: new[] { "UploadedByUserId", "SizeBytes" });
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropIndex(
                name: "IX_StoredFiles_UploadedByUserId_SizeBytes",
                table: "StoredFiles");
        }
    }
}
